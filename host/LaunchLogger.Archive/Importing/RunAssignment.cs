namespace LaunchLogger.Archive.Importing;

/// <summary>Who and where new runs belong to, by name; all optional. The class defaults to the car's.</summary>
public sealed record RunAssignment
{
    /// <summary>No assignment.</summary>
    public static RunAssignment None { get; } = new();

    /// <summary>The event.</summary>
    public string? Event { get; init; }

    /// <summary>The car.</summary>
    public string? Car { get; init; }

    /// <summary>The driver.</summary>
    public string? Driver { get; init; }

    /// <summary>The class (default: the car's).</summary>
    public string? Class { get; init; }
}
