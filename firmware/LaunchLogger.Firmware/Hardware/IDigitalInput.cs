namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A digital input such as the brake switch or the mark button, read raw once a loop
    /// pass; the loop debounces it (<see cref="CaptureLoop.SwitchHoldMicros"/>).</summary>
    public interface IDigitalInput
    {
        /// <summary>True while the input reads active now (brake applied, button pressed), bounce and all.</summary>
        bool IsActive();
    }
}
