namespace LaunchLogger.Firmware.Run
{
    /// <summary>How a status LED shows each run phase: a repeating on/off pattern, the same on
    /// every board.</summary>
    /// <remarks>
    /// <list type="table">
    /// <item><term>Idle</term><description>one short blink a second: powered, waiting for stillness</description></item>
    /// <item><term>Staged</term><description>steady on: still, ready for a launch</description></item>
    /// <item><term>Moving</term><description>fast even flashing (5 Hz): run open, rollout not yet covered</description></item>
    /// <item><term>RolledOut</term><description>mostly on with short gaps: run open past the rollout mark</description></item>
    /// <item><term>Stopped</term><description>two short blinks every two seconds: run closed and written</description></item>
    /// <item><term>BenchRest</term><description>one long blink (0.6 s) every two seconds: let go of the button, stand clear, keep the box still</description></item>
    /// <item><term>Fault (<see cref="IsFault"/>)</term><description>three fast blinks then a pause: no storage for the log</description></item>
    /// </list>
    /// </remarks>
    public static class PhaseBlinkPattern
    {
        /// <summary>Whether the LED is lit <paramref name="elapsedMs"/> after the phase began.</summary>
        public static bool IsOn(RunPhase phase, long elapsedMs)
        {
            switch (phase)
            {
                case RunPhase.Idle:
                    return elapsedMs % 1000 < 100;
                case RunPhase.Staged:
                    return true;
                case RunPhase.Moving:
                    return elapsedMs % 200 < 100;
                case RunPhase.RolledOut:
                    return elapsedMs % 500 < 400;
                case RunPhase.Stopped:
                    long t = elapsedMs % 2000;
                    return t < 100 || (t >= 200 && t < 300);
                case RunPhase.BenchRest:
                    return elapsedMs % 2000 < 600;
                default:
                    return false;
            }
        }

        /// <summary>The fault pattern: three 50 ms blinks every second.</summary>
        public static bool IsFault(long elapsedMs)
        {
            long t = elapsedMs % 1000;
            return t < 300 && t % 100 < 50;
        }
    }
}
