namespace LaunchLogger.Archive.Board;

/// <summary>A whole board: one section per class, and the runs that do not count.</summary>
public sealed record BoardResult
{
    /// <summary>The tie rule, in words (also in the README).</summary>
    public const string TieRule =
        "figures are compared at the board's resolution (0.001 s, 0.001 m/s, 0.001 m); on a tie the smaller uncertainty ranks first, then the run filed first";

    /// <summary>The figure's code.</summary>
    public required string Figure { get; init; }

    /// <summary>The figure in words.</summary>
    public required string Description { get; init; }

    /// <summary>"standstill" or "rollout" ("none" for figures without conventions).</summary>
    public required string Convention { get; init; }

    /// <summary>"valid", "doubtful" or "all".</summary>
    public required string Accept { get; init; }

    /// <summary>"s", "m/s" or "m".</summary>
    public required string Unit { get; init; }

    /// <summary>True when higher values rank first.</summary>
    public required bool HigherIsBetter { get; init; }

    /// <summary>True when each driver's best run only is shown.</summary>
    public required bool BestPerDriver { get; init; }

    /// <summary>How ties are broken.</summary>
    public string Ties { get; init; } = TieRule;

    /// <summary>One per class, in class-name order (runs without a class last).</summary>
    public required IReadOnlyList<BoardSection> Sections { get; init; }

    /// <summary>Reruns and disqualifications among the runs asked for, with their reasons.</summary>
    public required IReadOnlyList<BoardRow> NotCounted { get; init; }

    /// <summary>Runs with the figure left out for their verdict.</summary>
    public required int LeftOutForVerdict { get; init; }
}
