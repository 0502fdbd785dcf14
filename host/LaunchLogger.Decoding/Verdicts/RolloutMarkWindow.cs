using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Verdicts;

/// <summary>Where the box's own rollout mark can fall, given our reconstruction, when nothing is wrong.</summary>
/// <remarks>
/// The box counts whole pulses from its first motion and draws straight lines between them
/// (firmware <c>RunRecorder</c>): its distance is the pulse count times the metres per pulse,
/// while the wheel had only covered the unknown phase of its first tooth plus the pulses after it.
/// At each pulse the box is therefore ahead of the wheel by less than one pulse spacing, and
/// between pulses the straight line over an accelerating wheel adds at most one more: the box
/// reaches the rollout distance R when its wheel has covered between R − 2 spacings and R.
/// A wheel that slips ahead of the car (the box's pickup on a spinning driven wheel) only makes
/// the box's mark earlier, by an amount the road distance cannot bound: then the window opens at
/// first motion. Both ends widen by our own mark's 3σ and a fixed allowance for the box's
/// bracket midpoints and integer arithmetic (<see cref="VerdictLimits.RolloutDisagreementS"/>).
/// </remarks>
public static class RolloutMarkWindow
{
    /// <summary>The window on the input's clock; null when our trajectory never reaches the box's rollout distance.</summary>
    public static TimeWindow? For(RunAnalysis analysis, VerdictLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        limits ??= VerdictLimits.Default;
        Trajectory trajectory = analysis.Reconstruction.Trajectory;
        Estimate firstMotion = analysis.Figures.FirstMotionS;
        double rolloutM = analysis.Run.Configuration.RolloutM;
        double spacingM = analysis.Run.Configuration.MetresPerPulse;
        int start = FigureCalculator.FirstIndexAtOrAfter(trajectory.TimeS, firstMotion.Value);
        if (FigureCalculator.DistanceCrossing(trajectory, start, rolloutM) is not { } late)
        {
            return null;
        }

        bool boxWheelSlipped = analysis.Reconstruction.DistanceChannel != 0
            || analysis.Reconstruction.WheelspinWindows.Any(w => w.StartS <= late.Value);
        double nearestM = boxWheelSlipped ? 0 : rolloutM - (2 * spacingM);
        double earlyS = nearestM > 0 && FigureCalculator.DistanceCrossing(trajectory, start, nearestM) is { } early
            ? early.Value
            : firstMotion.Value;
        double slack = limits.RolloutDisagreementS + (3 * late.Sigma);
        return new TimeWindow(earlyS - slack, late.Value + slack);
    }
}
