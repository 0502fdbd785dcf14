namespace LaunchLogger.Decoding.Metrics;

/// <summary>A timed speed interval under both conventions. Durations in seconds; null where the
/// run never reached the end speed (or the rollout mark, for the rollout column).</summary>
/// <param name="Interval">What was timed.</param>
/// <param name="FromStandstillS">From first motion (standing intervals) or from the start speed.</param>
/// <param name="FromRolloutS">From the rollout mark (standing intervals); equal to
/// <paramref name="FromStandstillS"/> for rolling and passing intervals, which no convention changes.</param>
/// <param name="UncertaintyS">1-σ of <paramref name="FromStandstillS"/>.</param>
/// <param name="FromRolloutUncertaintyS">1-σ of <paramref name="FromRolloutS"/>.</param>
public sealed record IntervalFigure(
    SpeedInterval Interval,
    double? FromStandstillS,
    double? FromRolloutS,
    double? UncertaintyS,
    double? FromRolloutUncertaintyS);

/// <summary>A timed distance mark under both conventions, with its trap speed.</summary>
/// <param name="Mark">What was timed.</param>
/// <param name="FromStandstillS">Elapsed time from first motion to the mark, s.</param>
/// <param name="FromRolloutS">Elapsed time from the rollout mark to the mark, s.</param>
/// <param name="UncertaintyS">1-σ of <paramref name="FromStandstillS"/>.</param>
/// <param name="FromRolloutUncertaintyS">1-σ of <paramref name="FromRolloutS"/>.</param>
/// <param name="SpeedAtMarkMps">Speed at the mark, m/s.</param>
/// <param name="TrapSpeedMps">Mean speed over the trap ending at the mark, m/s; null without a trap.</param>
/// <param name="TrapSpeedUncertaintyMps">1-σ of <paramref name="TrapSpeedMps"/>.</param>
public sealed record MarkFigure(
    DistanceMark Mark,
    double? FromStandstillS,
    double? FromRolloutS,
    double? UncertaintyS,
    double? FromRolloutUncertaintyS,
    double? SpeedAtMarkMps,
    double? TrapSpeedMps,
    double? TrapSpeedUncertaintyMps);

/// <summary>Every acceleration figure of one run.</summary>
public sealed record FigureSet
{
    /// <summary>First motion on the input's time axis, s.</summary>
    public required Estimate FirstMotionS { get; init; }

    /// <summary>The rollout mark on the input's time axis, s; null when never reached.</summary>
    public Estimate? RolloutTimeS { get; init; }

    /// <summary>Speed at the rollout mark, m/s.</summary>
    public Estimate? RolloutSpeedMps { get; init; }

    /// <summary>Rollout distance used, m.</summary>
    public required double RolloutDistanceM { get; init; }

    /// <summary>Timed speed intervals, in request order.</summary>
    public required IReadOnlyList<IntervalFigure> SpeedIntervals { get; init; }

    /// <summary>Timed distance marks, in request order.</summary>
    public required IReadOnlyList<MarkFigure> DistanceMarks { get; init; }

    /// <summary>Highest longitudinal acceleration after first motion, m/s².</summary>
    public required double PeakAccelMps2 { get; init; }

    /// <summary>Mean acceleration from standstill to 60 mph (26.8224 m/s ÷ the 0–60 time), m/s²;
    /// null when 60 mph was not reached.</summary>
    public double? MeanAccel0To60Mps2 { get; init; }

    /// <summary>Highest speed reached, m/s.</summary>
    public required double MaxSpeedMps { get; init; }

    /// <summary>Distance covered from standstill to the end of the trajectory, m.</summary>
    public required double DistanceM { get; init; }

    /// <summary>Intervals whose end speed was crossed but not clearly passed (within 2σ of the
    /// top speed before the acceleration ended), so not timed: each with the highest speed reached
    /// before the acceleration ended and the speed's σ at the crossing, m/s.</summary>
    public IReadOnlyList<(SpeedInterval Interval, double TopMps, double SigmaMps)> NotClearlyReached { get; init; } = [];
}
