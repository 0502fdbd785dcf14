namespace LaunchLogger.Firmware.Wire
{
    /// <summary>The kind byte of an <see cref="FrameType.Event"/> frame (LOG-FORMAT.md, 0x04).</summary>
    public enum EventKind : byte
    {
        /// <summary>The car has been still long enough; carries the resting gravity vector.</summary>
        Staged = 1,

        /// <summary>The firmware's first-motion estimate; carries its cause.</summary>
        Motion = 2,

        /// <summary>The firmware's rollout mark; carries the speed there.</summary>
        Rollout = 3,

        /// <summary>No pulses for the stop time: the run is over.</summary>
        Stopped = 4,

        /// <summary>Brake switch closed.</summary>
        BrakeOn = 5,

        /// <summary>Brake switch opened.</summary>
        BrakeOff = 6,

        /// <summary>Manual mark button pressed.</summary>
        Mark = 7,

        /// <summary>The accelerometer's FIFO overflowed; carries the samples presumed lost.</summary>
        AccelGap = 8,
    }
}
