using MathNet.Numerics.Distributions;

namespace LaunchLogger.Cli.Bench;

/// <summary>How sure a coverage figure is: the exact (Clopper–Pearson) confidence interval of a
/// proportion, for <c>k</c> runs of <c>n</c> within ±kσ. A group of a dozen runs that shows one
/// outside ±2σ (92 %) is as consistent with a σ that covers 95 % as one that shows none (100 %):
/// the interval says which coverage figures can judge the goal and which cannot.</summary>
/// <remarks>
/// Clopper and Pearson (1934), Biometrika 26, 404–413: the bounds are the Beta quantiles
/// <code>
/// lower = B⁻¹(α/2; k, n − k + 1)        (0 when k = 0)
/// upper = B⁻¹(1 − α/2; k + 1, n − k)    (1 when k = n)
/// </code>
/// which are the p at which P(X ≥ k | p) = α/2 and P(X ≤ k | p) = α/2 for X ~ Binomial(n, p).
/// </remarks>
public static class CoverageInterval
{
    /// <summary>The two-sided interval's confidence the bench prints.</summary>
    public const double Confidence = 0.95;

    /// <summary>The exact two-sided interval of the proportion <paramref name="covered"/> /
    /// <paramref name="total"/> at <paramref name="confidence"/>, as fractions.</summary>
    /// <exception cref="ArgumentOutOfRangeException">When the counts are not 0 ≤ covered ≤ total, total ≥ 1, or the confidence not in (0, 1).</exception>
    public static (double Lower, double Upper) ClopperPearson(int covered, int total, double confidence = Confidence)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(total, 1);
        ArgumentOutOfRangeException.ThrowIfNegative(covered);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(covered, total);
        if (!(confidence > 0 && confidence < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(confidence), confidence, "the confidence must lie between 0 and 1");
        }

        double alpha = 1 - confidence;
        double lower = covered == 0 ? 0 : Beta.InvCDF(covered, total - covered + 1, alpha / 2);
        double upper = covered == total ? 1 : Beta.InvCDF(covered + 1, total - covered, 1 - (alpha / 2));
        return (lower, upper);
    }
}
