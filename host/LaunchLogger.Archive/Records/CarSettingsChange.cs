using LaunchLogger.Decoding.Calibration;

namespace LaunchLogger.Archive.Records;

/// <summary>What changes in a car's settings; null members are carried over from the previous version.</summary>
public sealed record CarSettingsChange
{
    /// <summary>The wheel-speed pickup, in words (which wheel, what target).</summary>
    public string? Pickup { get; init; }

    /// <summary>Pulses per wheel revolution.</summary>
    public int? PulsesPerRevolution { get; init; }

    /// <summary>The tyre, in words (size, make-up, pressure).</summary>
    public string? Tyre { get; init; }

    /// <summary>Rolling circumference as measured by the owner, m (used when no calibration gives one).</summary>
    public double? CircumferenceM { get; init; }

    /// <summary>Calibration settings (from `calibrate`), applied to the car's runs.</summary>
    public CalibrationSettings? Calibration { get; init; }

    /// <summary>Where the calibration came from (its file).</summary>
    public string? CalibrationSource { get; init; }

    /// <summary>True when nothing changes.</summary>
    public bool IsEmpty => Pickup is null && PulsesPerRevolution is null && Tyre is null && CircumferenceM is null && Calibration is null;
}
