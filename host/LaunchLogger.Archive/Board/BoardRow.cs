namespace LaunchLogger.Archive.Board;

/// <summary>One line of the board.</summary>
public sealed record BoardRow
{
    /// <summary>Place in its class, 1 first; 0 for runs not counted.</summary>
    public int Rank { get; init; }

    /// <summary>The driver (null when the run has none).</summary>
    public string? Driver { get; init; }

    /// <summary>The car.</summary>
    public string? Car { get; init; }

    /// <summary>The class.</summary>
    public string? Class { get; init; }

    /// <summary>The event.</summary>
    public string? Event { get; init; }

    /// <summary>The archive's run id.</summary>
    public long Run { get; init; }

    /// <summary>The box's run number.</summary>
    public int BoxRun { get; init; }

    /// <summary>The figure, SI (s, m/s or m).</summary>
    public double Value { get; init; }

    /// <summary>Its 1-σ, SI.</summary>
    public double? Uncertainty { get; init; }

    /// <summary>"valid", "doubtful" or "invalid".</summary>
    public required string Verdict { get; init; }

    /// <summary>Verdict reason codes, comma-separated.</summary>
    public string Reasons { get; init; } = "";

    /// <summary>Eligible runs this driver made (the best is shown).</summary>
    public int Runs { get; init; } = 1;

    /// <summary>"counted", "rerun" or "disqualified".</summary>
    public string Standing { get; init; } = "counted";

    /// <summary>Why a run does not count.</summary>
    public string? StandingReason { get; init; }
}
