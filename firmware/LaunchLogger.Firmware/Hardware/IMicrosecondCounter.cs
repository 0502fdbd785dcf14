namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A free-running hardware counter of microseconds that wraps at 2^32.</summary>
    /// <remarks><see cref="Clock.MonotonicClock"/> extends it to 64 bits; it must be read at least
    /// once per wrap (about 71.6 minutes), which the capture loop does many times a second.</remarks>
    public interface IMicrosecondCounter
    {
        /// <summary>The low 32 bits of the microsecond counter.</summary>
        uint ReadMicros32();
    }
}
