using LaunchLogger.Firmware.Capture;

namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>Anything that yields pulse observations: a polled counter or a queue of
    /// timestamped edges filled by an interrupt or event thread.</summary>
    public interface IPulseSource
    {
        /// <summary>Takes the next observation, if one is waiting.</summary>
        /// <returns>False when there is none.</returns>
        bool TryRead(out PulseObservation observation);
    }
}
