using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Cli.Bench;

/// <summary>Where a run's top speed is too near 60 mph for the data to say whether the car reached
/// it, so either verdict is right: valid (with a 0-60 mph figure) or doubtful with
/// <c>target_not_reached</c>.</summary>
/// <remarks>
/// The decoder times an interval only when its estimated top speed clears the end speed by
/// <see cref="FigureCalculator.ClearPassSigmas"/> σ (σ: the speed's σ at the crossing, or at the
/// top when the estimate never crosses); otherwise the judge says <c>target_not_reached</c>, which
/// then means "the data cannot show 60 mph was reached". The estimate itself lies within
/// <see cref="CoverageSigmas"/> σ of the truth in 95 % of runs (the σ goal). So for a true top
/// speed <c>v</c>:
/// <code>
/// v &lt; 60 mph                     the figure does not exist: doubtful is the only right verdict
/// 60 mph ≤ v &lt; 60 mph + (2 + 2)σ  an honest estimate may or may not clear 60 mph + 2σ: either is right
/// v ≥ 60 mph + (2 + 2)σ            an honest estimate clears it: valid is the only right verdict
/// </code>
/// The lower side gets no band: a valid verdict there is a 0-60 mph time for a car that never
/// reached 60 mph, which a verdict must never let through (it needs an error beyond 2σ, which the
/// coverage goal already counts).
/// </remarks>
public static class TargetEdge
{
    /// <summary>The target: 60 mph, m/s.</summary>
    public const double TargetMps = 60 * Units.MpsPerMph;

    /// <summary>How far within σ an honest estimate lies of the truth in 95 % of runs: the σ goal's
    /// ±2σ (a normal error's 95 % band, from memory).</summary>
    public const double CoverageSigmas = 2;

    /// <summary>The band above the target, in σ, where either verdict is right.</summary>
    public const double BandSigmas = FigureCalculator.ClearPassSigmas + CoverageSigmas;

    /// <summary>True when a run whose true top speed is <paramref name="truthTopMps"/> reached the
    /// target by less than the data can resolve (<paramref name="topSpeedSigmaMps"/>, the decoder's
    /// σ of its top speed): either verdict is right.</summary>
    public static bool EitherVerdict(double truthTopMps, double? topSpeedSigmaMps) =>
        topSpeedSigmaMps is > 0 and var sigma && truthTopMps >= TargetMps && truthTopMps < TargetMps + (BandSigmas * sigma);

    /// <summary>The σ of <paramref name="ours"/>'s speed where the decoder weighed the target: the
    /// σ it declined 0-60 mph with when it did, else the σ at its 60-mph crossing, else at its top
    /// speed; null without a speed σ.</summary>
    public static double? TopSpeedSigmaMps(RunAnalysis ours)
    {
        ArgumentNullException.ThrowIfNull(ours);
        if (ours.Figures.NotClearlyReached.FirstOrDefault(d => Math.Abs(d.Interval.ToMps - TargetMps) < 1e-9 && d.Interval.IsStanding) is { Interval: not null } declined)
        {
            return declined.SigmaMps;
        }

        Trajectory t = ours.Reconstruction.Trajectory;
        if (t.SpeedSigmaMps is not { } sigma || t.Count == 0)
        {
            return null;
        }

        int top = 0;
        for (int i = 0; i < t.Count; i++)
        {
            if (t.SpeedMps[i] >= TargetMps)
            {
                return sigma[i];
            }

            if (t.SpeedMps[i] > t.SpeedMps[top])
            {
                top = i;
            }
        }

        return sigma[top];
    }
}
