namespace LaunchLogger.Archive.Records;

/// <summary>Which runs to list, by name; all optional.</summary>
public sealed record RunFilter
{
    /// <summary>Runs of this event.</summary>
    public string? Event { get; init; }

    /// <summary>Runs of this car.</summary>
    public string? Car { get; init; }

    /// <summary>Runs of this driver.</summary>
    public string? Driver { get; init; }

    /// <summary>Runs in this class.</summary>
    public string? Class { get; init; }

    /// <summary>Runs at events in this calendar year.</summary>
    public int? Season { get; init; }
}
