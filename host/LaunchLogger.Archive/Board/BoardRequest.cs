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

    /// <summary>A request from the words people type (the board verb's options, the board
    /// page's query): a figure code, "standstill" or "rollout", and "valid", "doubtful" or "all".</summary>
    /// <exception cref="FormatException">A word not understood (the message says what to give).</exception>
    public static BoardRequest Parse(string figure, string from, string accept, RunFilter? filter = null, bool everyRun = false) => new()
    {
        Figure = BoardFigures.Find(figure) ?? throw new FormatException($"--figure {figure}: give one of {BoardFigures.Codes}"),
        Convention = from.ToLowerInvariant() switch
        {
            "standstill" => Convention.Standstill,
            "rollout" => Convention.Rollout,
            _ => throw new FormatException($"--from {from}: give standstill or rollout"),
        },
        Accept = accept.ToLowerInvariant() switch
        {
            "valid" => Acceptance.Valid,
            "doubtful" => Acceptance.Doubtful,
            "all" => Acceptance.All,
            _ => throw new FormatException($"--accept {accept}: give valid, doubtful or all"),
        },
        Filter = filter ?? new RunFilter(),
        EveryRun = everyRun,
    };
}
