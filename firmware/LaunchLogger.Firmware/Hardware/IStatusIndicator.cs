using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A status LED, buzzer or display that shows the run phase to the driver.</summary>
    public interface IStatusIndicator
    {
        /// <summary>Called once each time the phase changes.</summary>
        void Show(RunPhase phase);
    }
}
