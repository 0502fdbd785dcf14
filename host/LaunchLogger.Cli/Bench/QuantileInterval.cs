using MathNet.Numerics.Distributions;

namespace LaunchLogger.Cli.Bench;

/// <summary>How sure a pooled p95 is: a distribution-free confidence interval for a quantile from
/// the order statistics of the sample, the binomial bracket on ranks. It needs nothing of the
/// errors' distribution but that the runs are drawn independently, so it holds for the bench's
/// heavy-tailed |errors| as for any other.</summary>
/// <remarks>
/// W. J. Conover, "Practical Nonparametric Statistics", 3rd ed. (1999), §3.2 (the confidence
/// interval for a quantile), and G. J. Hahn and W. Q. Meeker, "Statistical Intervals" (1991),
/// ch. 5; both from memory. With X₍₁₎ ≤ … ≤ X₍ₙ₎ the sorted sample and ξ the p-quantile, the count
/// Y of values at or below ξ is Binomial(n, p), so P(X₍ᵣ₎ &gt; ξ) = P(Y ≤ r − 1) and
/// P(X₍ₛ₎ &lt; ξ) = P(Y ≥ s). With B the binomial CDF and α = 1 − confidence:
/// <code>
/// r = the largest rank with B(r − 1) ≤ α/2      (none: no lower bound from the data)
/// s = the smallest rank with B(s − 1) ≥ 1 − α/2 (none: no upper bound from the data)
/// P(X₍ᵣ₎ ≤ ξ ≤ X₍ₛ₎) ≥ B(s − 1) − B(r − 1) ≥ 1 − α
/// </code>
/// The split is even (α/2 a side) and conservative: each side misses at most α/2, the coverage
/// printed is the interval's own. The upper bound needs pⁿ ≤ α/2: for p95 at 95 %, n ≥ 72 runs;
/// fewer cannot bound the p95 from above, whatever they show.
/// </remarks>
public static class QuantileInterval
{
    /// <summary>The two-sided interval's confidence the bench prints.</summary>
    public const double Confidence = 0.95;

    /// <summary>The ranks (1-based) bracketing the <paramref name="p"/>-quantile of
    /// <paramref name="n"/> values at <paramref name="confidence"/>: the lower rank, 0 when no
    /// value bounds it from below; the upper, <paramref name="n"/> + 1 when none bounds it from
    /// above; and the interval's exact coverage for a continuous distribution.</summary>
    /// <exception cref="ArgumentOutOfRangeException">When n &lt; 1, or p or the confidence is not in (0, 1).</exception>
    public static (int LowerRank, int UpperRank, double Coverage) Ranks(int n, double p, double confidence = Confidence)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(n, 1);
        if (!(p > 0 && p < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(p), p, "the quantile must lie between 0 and 1");
        }

        if (!(confidence > 0 && confidence < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(confidence), confidence, "the confidence must lie between 0 and 1");
        }

        // B is non-decreasing in k, so each rank is the edge of a bisection over 0…n.
        double half = (1 - confidence) / 2;
        double Cdf(int k) => k >= n ? 1 : Binomial.CDF(p, n, k);
        int lower = LastAtOrBelow(n, r => Cdf(r - 1) <= half);
        int upper = n + 1 - LastAtOrBelow(n, j => Cdf(n - j) >= 1 - half);

        double below = lower == 0 ? 0 : Cdf(lower - 1);
        double atOrBelow = upper == n + 1 ? 1 : Cdf(upper - 1);
        return (lower, upper, atOrBelow - below);
    }

    /// <summary>The interval of the <paramref name="p"/>-quantile of an ascending sample:
    /// −∞ or +∞ where the sample cannot bound it (too few values), with the ranks and the coverage.</summary>
    /// <exception cref="ArgumentException">When the sample is empty.</exception>
    public static Bracket Of(double[] sorted, double p, double confidence = Confidence)
    {
        ArgumentNullException.ThrowIfNull(sorted);
        if (sorted.Length == 0)
        {
            throw new ArgumentException("no values", nameof(sorted));
        }

        (int lower, int upper, double coverage) = Ranks(sorted.Length, p, confidence);
        return new Bracket(
            lower == 0 ? double.NegativeInfinity : sorted[lower - 1],
            upper > sorted.Length ? double.PositiveInfinity : sorted[upper - 1],
            lower,
            upper,
            coverage);
    }

    /// <summary>The fewest values whose largest bounds the <paramref name="p"/>-quantile from
    /// above at <paramref name="confidence"/>: the smallest n with pⁿ ≤ α/2 (72 for p95 at 95 %).</summary>
    public static int RunsForUpperBound(double p, double confidence = Confidence) =>
        (int)Math.Ceiling(Math.Log((1 - confidence) / 2) / Math.Log(p));

    /// <summary>The largest i in 1…<paramref name="n"/> for which <paramref name="holds"/>(i), 0 for
    /// none, where <paramref name="holds"/> is true up to some i and false beyond it.</summary>
    private static int LastAtOrBelow(int n, Func<int, bool> holds)
    {
        int low = 0, high = n;
        while (low < high)
        {
            int mid = (low + high + 1) / 2;
            if (holds(mid))
            {
                low = mid;
            }
            else
            {
                high = mid - 1;
            }
        }

        return low;
    }

    /// <summary>A quantile's interval.</summary>
    /// <param name="Lower">The lower bound (−∞ when the sample has none).</param>
    /// <param name="Upper">The upper bound (+∞ when the sample has none).</param>
    /// <param name="LowerRank">Its rank, 1-based (0 for none).</param>
    /// <param name="UpperRank">Its rank, 1-based (n + 1 for none).</param>
    /// <param name="Coverage">The interval's exact coverage (at least the confidence asked).</param>
    public sealed record Bracket(double Lower, double Upper, int LowerRank, int UpperRank, double Coverage)
    {
        /// <summary>Where the interval lies against a goal's limit on the quantile: wholly within
        /// (its upper bound at or under the limit), wholly outside (its lower bound over it), or
        /// around it (the data cannot tell which side the true quantile is on).</summary>
        public GoalSide Against(double limit) => Upper <= limit ? GoalSide.WhollyWithin : Lower > limit ? GoalSide.WhollyOutside : GoalSide.GoalInside;
    }

    /// <summary>Where a quantile's interval lies against a goal's limit.</summary>
    public enum GoalSide
    {
        /// <summary>The whole interval meets the goal.</summary>
        WhollyWithin,

        /// <summary>The goal's limit lies inside the interval.</summary>
        GoalInside,

        /// <summary>The whole interval misses the goal.</summary>
        WhollyOutside,
    }
}
