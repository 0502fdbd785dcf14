namespace LaunchLogger.Firmware.Wire
{
    /// <summary>What made the firmware decide the car had started moving.</summary>
    public enum MotionCause : byte
    {
        /// <summary>The distance channel's pulse count changed while staged.</summary>
        PulseCount = 1,

        /// <summary>Forward acceleration rose above the threshold while staged.</summary>
        AccelOnset = 2,

        /// <summary>The run opened while already rolling (no staging before it).</summary>
        RollingDistance = 3,
    }
}
