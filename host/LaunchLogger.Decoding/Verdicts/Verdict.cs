namespace LaunchLogger.Decoding.Verdicts;

/// <summary>How far a run's figures can be trusted.</summary>
public enum VerdictLevel
{
    /// <summary>Nothing found that weakens the figures.</summary>
    Valid,

    /// <summary>Usable with care: the reasons say what to check.</summary>
    Doubtful,

    /// <summary>Do not quote the figures.</summary>
    Invalid,
}

/// <summary>One reason behind a verdict.</summary>
/// <param name="Level">How serious it is.</param>
/// <param name="Code">A stable snake_case name for scripts, e.g. "wheelspin".</param>
/// <param name="Text">What was found, for people.</param>
public sealed record VerdictReason(VerdictLevel Level, string Code, string Text);

/// <summary>A run's verdict: the worst level among its reasons (valid when there are none).</summary>
/// <param name="Reasons">Everything found, worst first.</param>
public sealed record Verdict(IReadOnlyList<VerdictReason> Reasons)
{
    /// <summary>The verdict level.</summary>
    public VerdictLevel Level => Reasons.Count == 0 ? VerdictLevel.Valid : Reasons.Max(r => r.Level);
}
