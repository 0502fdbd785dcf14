using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>Every run of a report, judged together: the braking bound of the best stop among
/// them (or of a reference log) holds for all their launches.</summary>
public sealed class SessionAnalysis
{
    /// <summary>The runs, in input order, each with its verdict.</summary>
    public required IReadOnlyList<RunAnalysis> Runs { get; init; }

    /// <summary>The braking bound applied, when any run (or the reference) ended with a stop.</summary>
    public TractionBound? Bound { get; init; }

    /// <summary>Runs that could not be analysed, one line each.</summary>
    public required IReadOnlyList<string> Failures { get; init; }
}
