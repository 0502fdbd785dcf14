using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Corrections;

/// <summary>Averages two runs made in opposite directions over the same ground.</summary>
/// <remarks>Common practice in vehicle testing: a slope helps one way as much as it hinders the
/// other, and so, to first order, does a steady wind; the arithmetic mean of the two runs' figures
/// cancels both. Each figure's σ is half the root-sum-square of the two.</remarks>
public static class PairAverage
{
    /// <summary>How the pair is combined, in words, for reports.</summary>
    public const string Method = "arithmetic mean of two runs in opposite directions; cancels grade and steady wind to first order";

    /// <summary>The mean of two figure sets timed with the same request.</summary>
    /// <exception cref="ArgumentException">The sets were timed with different requests.</exception>
    public static FigureSet Mean(FigureSet a, FigureSet b)
    {
        ArgumentNullException.ThrowIfNull(a);
        ArgumentNullException.ThrowIfNull(b);
        if (a.SpeedIntervals.Count != b.SpeedIntervals.Count || a.DistanceMarks.Count != b.DistanceMarks.Count)
        {
            throw new ArgumentException("the two runs were timed with different figure requests");
        }

        return a with
        {
            SpeedIntervals = a.SpeedIntervals.Zip(b.SpeedIntervals, (x, y) => x with
            {
                FromStandstillS = Mean(x.FromStandstillS, y.FromStandstillS),
                FromRolloutS = Mean(x.FromRolloutS, y.FromRolloutS),
                UncertaintyS = HalfRss(x.UncertaintyS, y.UncertaintyS),
                FromRolloutUncertaintyS = HalfRss(x.FromRolloutUncertaintyS, y.FromRolloutUncertaintyS),
            }).ToList(),
            DistanceMarks = a.DistanceMarks.Zip(b.DistanceMarks, (x, y) => x with
            {
                FromStandstillS = Mean(x.FromStandstillS, y.FromStandstillS),
                FromRolloutS = Mean(x.FromRolloutS, y.FromRolloutS),
                UncertaintyS = HalfRss(x.UncertaintyS, y.UncertaintyS),
                FromRolloutUncertaintyS = HalfRss(x.FromRolloutUncertaintyS, y.FromRolloutUncertaintyS),
                SpeedAtMarkMps = Mean(x.SpeedAtMarkMps, y.SpeedAtMarkMps),
                TrapSpeedMps = Mean(x.TrapSpeedMps, y.TrapSpeedMps),
                TrapSpeedUncertaintyMps = HalfRss(x.TrapSpeedUncertaintyMps, y.TrapSpeedUncertaintyMps),
            }).ToList(),
            PeakAccelMps2 = 0.5 * (a.PeakAccelMps2 + b.PeakAccelMps2),
            MeanAccel0To60Mps2 = Mean(a.MeanAccel0To60Mps2, b.MeanAccel0To60Mps2),
            MaxSpeedMps = 0.5 * (a.MaxSpeedMps + b.MaxSpeedMps),
            DistanceM = 0.5 * (a.DistanceM + b.DistanceM),
        };
    }

    private static double? Mean(double? x, double? y) => x is { } p && y is { } q ? 0.5 * (p + q) : null;

    private static double? HalfRss(double? x, double? y) => x is { } p && y is { } q ? 0.5 * Math.Sqrt((p * p) + (q * q)) : null;
}
