namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>Which edges of the pickup signal are counted. Pulses per revolution in the settings
/// must match: teeth × 1 for one edge, teeth × 2 for both.</summary>
public enum EdgeSelection
{
    /// <summary>Low-to-high transitions only.</summary>
    Rising,

    /// <summary>High-to-low transitions only.</summary>
    Falling,

    /// <summary>Every transition.</summary>
    Both,
}
