using LaunchLogger.Archive.Records;

namespace LaunchLogger.Archive.Board;

/// <summary>What board to make.</summary>
public sealed record BoardRequest
{
    /// <summary>The figure to rank by.</summary>
    public required BoardFigure Figure { get; init; }

    /// <summary>Standing-start figures timed from standstill or after the rollout.</summary>
    public Convention Convention { get; init; } = Convention.Standstill;

    /// <summary>Which verdicts count.</summary>
    public Acceptance Accept { get; init; } = Acceptance.Valid;

    /// <summary>Which runs (event, class, season, car, driver).</summary>
    public RunFilter Filter { get; init; } = new();

    /// <summary>True to list every eligible run instead of each driver's best.</summary>
    public bool EveryRun { get; init; }
}
