using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Corrections;

namespace LaunchLogger.Archive.Importing;

/// <summary>A <see cref="RunAssignment"/> looked up in the archive: the ids, and what the
/// analysis needs from them (the car's calibration, the event's weather).</summary>
public sealed record ResolvedAssignment
{
    /// <summary>The event's id.</summary>
    public long? EventId { get; init; }

    /// <summary>The car's id.</summary>
    public long? CarId { get; init; }

    /// <summary>The car's current settings version's id.</summary>
    public long? CarSettingsId { get; init; }

    /// <summary>The driver's id.</summary>
    public long? DriverId { get; init; }

    /// <summary>The class's id.</summary>
    public long? ClassId { get; init; }

    /// <summary>The car's calibration, applied to its runs.</summary>
    public CalibrationSettings? Calibration { get; init; }

    /// <summary>The event's weather, for figures corrected to standard air.</summary>
    public Weather? Weather { get; init; }
}
