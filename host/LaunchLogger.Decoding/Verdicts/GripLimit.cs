using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;

namespace LaunchLogger.Decoding.Verdicts;

/// <summary>Why a stop is taken to have been at the tyres' grip limit, so that its deceleration
/// shows the grip available and may bound the launches.</summary>
/// <param name="Basis">A stable snake_case name: <c>named_reference</c>, <c>wheel_slide</c> or
/// <c>deceleration_plateau</c>.</param>
/// <param name="Text">What was found, for people.</param>
public sealed record GripEvidence(string Basis, string Text);

/// <summary>Decides whether a stop was made at the grip limit. A stop short of the limit (a
/// gentle stop at the end of a run) shows only what the driver asked for, not what the tyres
/// could give, and bounds nothing.</summary>
public static class GripLimit
{
    /// <summary>The basis of a stop the user named as a braking reference.</summary>
    public const string NamedReference = "named_reference";

    /// <summary>The basis of a stop in which a wheel was seen sliding (ABS cycling or a lock).</summary>
    public const string WheelSlide = "wheel_slide";

    /// <summary>The basis of a stop whose deceleration held a flat top at a level only the grip limit gives.</summary>
    public const string DecelerationPlateau = "deceleration_plateau";

    /// <summary>Assesses the stop of <paramref name="analysis"/>; null when it has none or the
    /// stop shows no sign of having reached the grip limit.</summary>
    /// <param name="analysis">The run.</param>
    /// <param name="namedByUser">The user named this stop as the braking reference.</param>
    /// <param name="limits">Thresholds; <see cref="VerdictLimits.Default"/> when null.</param>
    public static GripEvidence? Assess(RunAnalysis analysis, bool namedByUser, VerdictLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        limits ??= VerdictLimits.Default;
        if (analysis.Braking is not { } stop)
        {
            return null;
        }

        if (namedByUser)
        {
            return new GripEvidence(NamedReference, "named by the user as a stop at the grip limit");
        }

        double slid = analysis.Reconstruction.BrakingSlideWindows
            .Sum(w => Math.Max(0, Math.Min(w.EndS, stop.StandstillS) - Math.Max(w.StartS, stop.OnsetS.Value)));
        if (slid > 0)
        {
            return new GripEvidence(WheelSlide, Invariant($"a wheel slid (ABS cycling or a lock) for {slid:0.00} s of the stop"));
        }

        // A flat top: the fully developed deceleration is high and the peak barely stands above
        // it, as when the tyres, not the pedal, set the deceleration.
        if (stop.MfddMps2 is { } mfdd && mfdd >= limits.GripPlateauMps2 && stop.PeakDecelMps2 <= limits.GripPlateauPeakRatio * mfdd)
        {
            return new GripEvidence(DecelerationPlateau, Invariant($"the deceleration held a plateau of {mfdd:0.00} m/s² (peak {stop.PeakDecelMps2:0.00} m/s²)"));
        }

        return null;
    }

    /// <summary>The bound from the stop at the grip limit that shows the most grip: stops the
    /// user named (<paramref name="references"/>) and stops among <paramref name="runs"/> with
    /// evidence of the limit; null when no stop qualifies.</summary>
    public static TractionBound? BestBound(IEnumerable<RunAnalysis> runs, IEnumerable<RunAnalysis>? references = null, VerdictLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(runs);
        return Best((references ?? []).Select(r => Candidate(r, namedByUser: true, limits)).Concat(runs.Select(r => Candidate(r, namedByUser: false, limits))));
    }

    /// <summary>The bound the stop of <paramref name="analysis"/> would set, or null when it has
    /// no stop at the grip limit: all a session needs to keep of a run for its bound.</summary>
    /// <param name="analysis">The run.</param>
    /// <param name="namedByUser">The user named this stop as the braking reference.</param>
    /// <param name="limits">Thresholds; <see cref="VerdictLimits.Default"/> when null.</param>
    public static TractionBound? Candidate(RunAnalysis analysis, bool namedByUser, VerdictLimits? limits = null) =>
        Assess(analysis, namedByUser, limits) is { } evidence && analysis.Braking is { } b
            ? new TractionBound(analysis.Run.Source, b.MeanDecelMps2, b.TractionBound0To60S, b.TractionBound0To100KmhS, evidence.Basis, evidence.Text)
            : null;

    /// <summary>Of the candidates (<see cref="Candidate"/>; nulls skipped), the one with the
    /// highest mean deceleration, the first of equals.</summary>
    public static TractionBound? Best(IEnumerable<TractionBound?> candidates)
    {
        ArgumentNullException.ThrowIfNull(candidates);
        TractionBound? best = null;
        foreach (TractionBound? candidate in candidates)
        {
            if (candidate is not null && (best is null || candidate.MeanDecelMps2 > best.MeanDecelMps2))
            {
                best = candidate;
            }
        }

        return best;
    }

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
