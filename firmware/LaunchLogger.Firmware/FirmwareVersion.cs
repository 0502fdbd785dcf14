namespace LaunchLogger.Firmware
{
    /// <summary>The firmware version written into every configuration frame.</summary>
    public static class FirmwareVersion
    {
        /// <summary>Major version: raised for changes users must act on.</summary>
        public const byte Major = 0;

        /// <summary>Minor version: raised for new features.</summary>
        public const byte Minor = 1;

        /// <summary>Patch version: raised for fixes.</summary>
        public const byte Patch = 0;
    }
}
