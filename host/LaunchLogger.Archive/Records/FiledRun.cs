namespace LaunchLogger.Archive.Records;

/// <summary>What the archive knows about a run beyond its report entry.</summary>
public sealed record FiledRun
{
    /// <summary>The archive's run id.</summary>
    public required long RunId { get; init; }

    /// <summary>The driver's name.</summary>
    public string? Driver { get; init; }

    /// <summary>The driver's club.</summary>
    public string? Club { get; init; }

    /// <summary>The car's name.</summary>
    public string? Car { get; init; }

    /// <summary>The class.</summary>
    public string? Class { get; init; }

    /// <summary>The event.</summary>
    public string? Event { get; init; }

    /// <summary>The event's date.</summary>
    public string? Date { get; init; }

    /// <summary>The venue.</summary>
    public string? Venue { get; init; }

    /// <summary>The event's weather as filed (T °C, P hPa, RH %).</summary>
    public string? Weather { get; init; }

    /// <summary>"counted", "rerun" or "disqualified".</summary>
    public string Standing { get; init; } = "counted";

    /// <summary>Why a run does not count.</summary>
    public string? StandingReason { get; init; }

    /// <summary>The car's settings version the run was filed with (1 first), when known.</summary>
    public int? SettingsVersion { get; init; }

    /// <summary>The pickup as described.</summary>
    public string? Pickup { get; init; }

    /// <summary>The tyre as described.</summary>
    public string? Tyre { get; init; }

    /// <summary>Where the car's calibration settings came from, and when they were filed.</summary>
    public string? CalibrationSource { get; init; }

    /// <summary>When the current result was made.</summary>
    public string? AnalysedAt { get; init; }

    /// <summary>Why analysis failed, when it did (then there is no report entry to show).</summary>
    public string? Failure { get; init; }

    /// <summary>The tool version that made the current result.</summary>
    public string? ToolVersion { get; init; }

    /// <summary>The run's current report entry as JSON (null when analysis failed).</summary>
    public string? ReportJson { get; init; }
}
