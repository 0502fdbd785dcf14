#nullable disable
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>How the status LED shows each run phase; the same patterns as the Linux board.</summary>
    /// <remarks>Idle: one short blink a second. Staged: steady on. Moving: 5 Hz even flashing.
    /// RolledOut: mostly on with short gaps. Stopped: two short blinks every two seconds.
    /// <see cref="IsFault"/>: three fast blinks then a pause (no storage for the log).</remarks>
    public static class BlinkPattern
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
