namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A debounced digital input such as the brake switch or the mark button.</summary>
    public interface IDigitalInput
    {
        /// <summary>True while the input is active (brake applied, button pressed).</summary>
        bool IsActive();
    }
}
