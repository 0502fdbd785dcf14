using LaunchLogger.Prescribed.Motion;

namespace LaunchLogger.Prescribed.Truth;

/// <summary>The exact time of one speed interval, or nulls where the run does not reach it while
/// accelerating (before its brake onset).</summary>
/// <param name="Span">The interval.</param>
/// <param name="FromStandstillS">From first motion (standing intervals) or from the lower speed
/// (passing intervals).</param>
/// <param name="FromRolloutS">From the rollout mark (standing intervals); for passing intervals
/// the same as <paramref name="FromStandstillS"/>.</param>
/// <param name="EndS">When the upper speed is reached, on the record's axis.</param>
public sealed record TruthInterval(TruthSpeedSpan Span, double? FromStandstillS, double? FromRolloutS, double? EndS);

/// <summary>The exact time at one distance mark (from the standstill position), or nulls.</summary>
/// <param name="Span">The mark.</param>
/// <param name="FromStandstillS">From first motion.</param>
/// <param name="FromRolloutS">From the rollout mark.</param>
/// <param name="SpeedAtMarkMps">Speed at the mark.</param>
/// <param name="TrapSpeedMps">Mean speed over the trap ending at the mark: its length divided by
/// the time to cross it (common practice; REFERENCES.md "mph = 45/Δt" over 66 ft).</param>
public sealed record TruthMark(TruthDistanceSpan Span, double? FromStandstillS, double? FromRolloutS, double? SpeedAtMarkMps, double? TrapSpeedMps);

/// <summary>The exact figures of a stop.</summary>
/// <param name="OnsetS">Brake onset: where the deceleration begins to build.</param>
/// <param name="OnsetSpeedMps">Speed at onset.</param>
/// <param name="StandstillS">When the car comes to rest.</param>
/// <param name="StoppingDistanceM">From onset to rest (SAE J299: from the start of brake
/// application to standstill).</param>
/// <param name="MeanDecelMps2">v²/(2·d) over the stop (kinematics).</param>
/// <param name="MfddMps2">Mean fully developed deceleration between 0.8·v₀ and 0.1·v₀ (UN
/// Regulation No. 13-H, annex on braking tests: d_m = (v_b² − v_e²)/(25.92·(s_e − s_b)) in km/h
/// and m, the same as (v_b² − v_e²)/(2·(s_e − s_b)) in m/s).</param>
/// <param name="RiseS">How long the deceleration took to build (∞ for a steady rise).</param>
public sealed record TruthStop(double OnsetS, double OnsetSpeedMps, double StandstillS, double StoppingDistanceM, double MeanDecelMps2, double MfddMps2, double RiseS);

/// <summary>Every truth figure of one run of a prescribed record.</summary>
public sealed record TruthRun
{
    /// <summary>The run's delimiting instants, as prescribed.</summary>
    public required RunMarks Marks { get; init; }

    /// <summary>True when the run starts from rest.</summary>
    public bool Standing => Marks.Standing;

    /// <summary>First motion, s; null for a run already moving at the record's start.</summary>
    public double? FirstMotionS { get; init; }

    /// <summary>When the car has moved the rollout distance from rest; null for a rolling start.</summary>
    public double? RolloutS { get; init; }

    /// <summary>Speed at the rollout mark.</summary>
    public double? RolloutSpeedMps { get; init; }

    /// <summary>Distance (on the record's axis) of the standstill position, m; the record's
    /// start for a rolling run.</summary>
    public required double OriginM { get; init; }

    /// <summary>The speed intervals, in request order.</summary>
    public required IReadOnlyList<TruthInterval> Intervals { get; init; }

    /// <summary>The distance marks, in request order (all null for a rolling start).</summary>
    public required IReadOnlyList<TruthMark> DistanceMarks { get; init; }

    /// <summary>The stop, or null when the run does not brake to rest.</summary>
    public TruthStop? Stop { get; init; }

    /// <summary>Highest speed in the run, m/s.</summary>
    public required double PeakSpeedMps { get; init; }

    /// <summary>The interval <paramref name="span"/>, matched by its speeds.</summary>
    public TruthInterval? Interval(TruthSpeedSpan span) =>
        Intervals.FirstOrDefault(i => Math.Abs(i.Span.FromMps - span.FromMps) < 1e-9 && Math.Abs(i.Span.ToMps - span.ToMps) < 1e-9);

    /// <summary>The mark at <paramref name="distanceM"/>.</summary>
    public TruthMark? Mark(double distanceM) => DistanceMarks.FirstOrDefault(m => Math.Abs(m.Span.DistanceM - distanceM) < 1e-9);
}
