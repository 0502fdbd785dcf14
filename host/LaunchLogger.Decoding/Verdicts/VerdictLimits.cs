namespace LaunchLogger.Decoding.Verdicts;

/// <summary>The thresholds the judge applies. Defaults are our own choices for club testing,
/// stated so that users can argue with them.</summary>
public sealed record VerdictLimits
{
    /// <summary>The defaults.</summary>
    public static VerdictLimits Default { get; } = new();

    /// <summary>|grade| above which a run is doubtful, %.</summary>
    public double DoubtfulGradePercent { get; init; } = 1.0;

    /// <summary>|grade| above which a run is invalid, %.</summary>
    public double InvalidGradePercent { get; init; } = 3.0;

    /// <summary>Share of wide-bracket observations above which a run is doubtful.</summary>
    public double WideBracketFraction { get; init; } = 0.02;

    /// <summary>Difference between the box's rollout mark and ours above which a run is doubtful, s.</summary>
    public double RolloutDisagreementS { get; init; } = 0.010;

    /// <summary>Wheelspin on the pickup wheel longer than this makes a run doubtful, s.</summary>
    public double WheelspinS { get; init; } = 0.05;
}
