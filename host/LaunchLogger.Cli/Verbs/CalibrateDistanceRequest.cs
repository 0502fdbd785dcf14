namespace LaunchLogger.Cli.Verbs;

/// <summary>What <c>launchlogger calibrate distance</c> was asked, typed.</summary>
public sealed record CalibrateDistanceRequest
{
    /// <summary>The log with the roll or rolls.</summary>
    public required FileInfo Log { get; init; }

    /// <summary>The taped distance between the start and end lines, m.</summary>
    public required double Metres { get; init; }

    /// <summary>1-σ of the taped distance, line-up included, m.</summary>
    public double TapeUncertaintyM { get; init; } = 0.05;

    /// <summary>Runs to use: "N" or "N-M" (runs joined into one roll); several are averaged as repeats.</summary>
    public IReadOnlyList<string> Runs { get; init; } = [];

    /// <summary>Settings file to create or update.</summary>
    public FileInfo? Settings { get; init; }

    /// <summary>True for JSON output.</summary>
    public bool Json { get; init; }
}
