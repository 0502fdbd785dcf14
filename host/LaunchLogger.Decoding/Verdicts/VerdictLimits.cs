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

    /// <summary>A bracket this many times the run's median bracket stands out from its loop (a
    /// stall): our choice, as a polled loop's bracket is one period and its jitter, under half a
    /// period, while a stall spans several periods.</summary>
    public double WideBracketOverMedian { get; init; } = 3;

    /// <summary>Difference between the box's rollout mark and ours above which a run is doubtful, s.</summary>
    public double RolloutDisagreementS { get; init; } = 0.010;

    /// <summary>Wheelspin on the pickup wheel longer than this makes a run doubtful, s.</summary>
    public double WheelspinS { get; init; } = 0.05;

    /// <summary>Mean fully developed deceleration from which a flat-topped stop is taken to be at
    /// the grip limit, m/s²: 0.8 g. Our choice: road tyres on dry asphalt give roughly 0.8–1.1 g
    /// (common practice), while a driver's ordinary firm stop stays nearer 0.3–0.6 g.</summary>
    public double GripPlateauMps2 { get; init; } = 0.8 * 9.80665;

    /// <summary>The peak deceleration of a plateau stays within this factor of its mean fully
    /// developed deceleration (a flat top, not a spike).</summary>
    public double GripPlateauPeakRatio { get; init; } = 1.15;
}
