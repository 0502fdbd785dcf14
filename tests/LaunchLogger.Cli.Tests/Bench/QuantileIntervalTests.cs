using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>The pooled p95's distribution-free interval: the binomial bracket on ranks (W. J.
/// Conover, "Practical Nonparametric Statistics", 3rd ed., §3.2; G. J. Hahn and W. Q. Meeker,
/// "Statistical Intervals", ch. 5; from memory), checked by hand, against a reference library's
/// binomial CDF, and by drawing from a distribution whose p95 has a closed form.</summary>
public class QuantileIntervalTests
{
    /// <summary>n = 20, p = 0.95, 95 %: Y (values at or below the p95) ~ Binomial(20, 0.95), so
    /// W = 20 − Y ~ Binomial(20, 0.05) and, worked by hand,
    /// <code>
    /// P(W = 0) = 0.95²⁰                      = 0.358485922
    /// P(W = 1) = 20 · 0.05 · 0.95¹⁹          = 0.377353603
    /// P(W = 2) = 190 · 0.05² · 0.95¹⁸        = 0.188676801
    /// P(W = 3) = 1140 · 0.05³ · 0.95¹⁷       = 0.059582148
    /// P(Y ≤ 16) = 1 − P(W ≤ 3) = 0.015901526  ≤ 0.025
    /// P(Y ≤ 17) = 1 − P(W ≤ 2) = 0.075483674  &gt; 0.025   so the lower rank is 17
    /// P(Y ≤ 19) = 1 − 0.95²⁰   = 0.641514078  &lt; 0.975   so no rank bounds it from above
    /// </code>
    /// and the interval [X₍₁₇₎, ∞) covers the p95 with probability 1 − P(Y ≤ 16) = 0.984098474.</summary>
    [Fact]
    public void Twenty_runs_bracket_the_p95_from_the_17th_up_with_no_upper_bound()
    {
        (int lower, int upper, double coverage) = QuantileInterval.Ranks(20, 0.95);

        Assert.Equal(17, lower);
        Assert.Equal(21, upper);
        Assert.Equal(0.984098474, coverage, 8);

        double[] sorted = Enumerable.Range(1, 20).Select(i => 0.1 * i).ToArray();
        QuantileInterval.Bracket b = QuantileInterval.Of(sorted, 0.95);
        Assert.Equal(1.7, b.Lower, 12);
        Assert.True(double.IsPositiveInfinity(b.Upper));
    }

    /// <summary>The largest of n bounds the p95 from above at 95 % once P(all n at or below it) =
    /// 0.95ⁿ ≤ 0.025: 0.95⁷¹ = 0.0262 and 0.95⁷² = 0.0249 (by hand), so 72 runs are the fewest.</summary>
    [Fact]
    public void Seventy_two_runs_are_the_fewest_whose_largest_bounds_the_p95()
    {
        Assert.Equal(72, QuantileInterval.RunsForUpperBound(0.95));
        Assert.Equal(72, QuantileInterval.Ranks(71, 0.95).UpperRank); // n + 1: none
        Assert.Equal(72, QuantileInterval.Ranks(72, 0.95).UpperRank); // the largest

        // p90 of 72: W = 72 − Y ~ Binomial(72, 0.1); P(W ≤ 2) = 0.9⁷² + 7.2 · 0.9⁷¹ + 25.56 · 0.9⁷⁰
        // = 0.00051 + 0.00406 + 0.01602 = 0.0206 (by hand), so P(Y ≤ 69) = 0.9794 ≥ 0.975, while
        // P(Y ≤ 68) = 1 − P(W ≤ 3) = 1 − (0.0206 + 0.0415) = 0.938: the upper rank is 70.
        Assert.Equal(70, QuantileInterval.Ranks(72, 0.90).UpperRank);
    }

    /// <summary>The ranks and coverage (the code takes the CDF from MathNet.Numerics) against the
    /// binomial law summed here term by term from its definition, C(n, k)·pᵏ·(1 − p)ⁿ⁻ᵏ with
    /// log-factorials so no power underflows (W. Feller, "An Introduction to Probability Theory and
    /// Its Applications", vol. 1, ch. VI; from memory), scanned rank by rank, for the run counts the
    /// pooled bench has (a dozen to a few thousand) and other quantiles.</summary>
    [Theory]
    [InlineData(12, 0.95)]
    [InlineData(50, 0.95)]
    [InlineData(77, 0.95)]
    [InlineData(160, 0.95)]
    [InlineData(400, 0.95)]
    [InlineData(1600, 0.95)]
    [InlineData(6400, 0.95)]
    [InlineData(101, 0.5)]
    [InlineData(300, 0.99)]
    public void Ranks_and_coverage_agree_with_the_binomial_law_summed_from_its_definition(int n, double p)
    {
        double[] cdf = SummedCdf(n, p);
        double Cdf(int k) => k < 0 ? 0 : cdf[k];
        int lower = Enumerable.Range(1, n).Where(r => Cdf(r - 1) <= 0.025).DefaultIfEmpty(0).Max();
        int upper = Enumerable.Range(1, n).Where(s => Cdf(s - 1) >= 0.975).DefaultIfEmpty(n + 1).Min();

        (int ourLower, int ourUpper, double coverage) = QuantileInterval.Ranks(n, p);

        Assert.Equal(lower, ourLower);
        Assert.Equal(upper, ourUpper);
        Assert.Equal(Cdf(upper - 1) - Cdf(lower - 1), coverage, 9);
        Assert.True(coverage >= 0.95);
    }

    /// <summary>P(Y ≤ k) for k = 0…n, Y ~ Binomial(n, p), each term from log-factorials.</summary>
    private static double[] SummedCdf(int n, double p)
    {
        var logFactorial = new double[n + 1];
        for (int i = 1; i <= n; i++)
        {
            logFactorial[i] = logFactorial[i - 1] + Math.Log(i);
        }

        var cdf = new double[n + 1];
        double sum = 0;
        for (int k = 0; k <= n; k++)
        {
            sum += Math.Exp(logFactorial[n] - logFactorial[k] - logFactorial[n - k] + (k * Math.Log(p)) + ((n - k) * Math.Log(1 - p)));
            cdf[k] = Math.Min(sum, 1);
        }

        return cdf;
    }

    /// <summary>Drawn: 4000 samples of 160 from the unit exponential, whose p95 is ln 20 (its
    /// quantile function −ln(1 − p), closed form). The interval holds it about as often as its
    /// coverage says (within 4 standard errors of a binomial count), and misses on either side
    /// no more often than 2.5 % allows.</summary>
    [Fact]
    public void Drawn_samples_are_covered_as_often_as_the_interval_promises()
    {
        const int Samples = 4000;
        const int N = 160;
        double truth = Math.Log(20);
        var random = new Random(20261205);
        int covered = 0, high = 0, low = 0;
        double coverage = QuantileInterval.Ranks(N, 0.95).Coverage;
        for (int k = 0; k < Samples; k++)
        {
            double[] x = Enumerable.Range(0, N).Select(_ => -Math.Log(1 - random.NextDouble())).Order().ToArray();
            QuantileInterval.Bracket b = QuantileInterval.Of(x, 0.95);
            if (b.Lower > truth)
            {
                high++;
            }
            else if (b.Upper < truth)
            {
                low++;
            }
            else
            {
                covered++;
            }
        }

        double se = Math.Sqrt(coverage * (1 - coverage) / Samples);
        Assert.InRange(covered / (double)Samples, coverage - (4 * se), coverage + (4 * se));
        double sideSe = Math.Sqrt(0.025 * 0.975 / Samples);
        Assert.True(high / (double)Samples <= 0.025 + (4 * sideSe), $"{high} of {Samples} above");
        Assert.True(low / (double)Samples <= 0.025 + (4 * sideSe), $"{low} of {Samples} below");
    }

    /// <summary>The goal line's words: met or NOT met on the p95 itself, then where the interval lies.</summary>
    [Fact]
    public void The_verdict_says_where_the_interval_lies_against_the_goal()
    {
        var goal = new BenchGoal(BenchFigure.FirstMotion, 5, "first motion p95 ≤ 5 ms");
        QuantileInterval.Bracket Around(double lo, double hi) => new(lo, hi, 1, 2, 0.95);

        Assert.Equal("met, interval wholly within", goal.Verdict(4, Around(3, 5)));
        Assert.Equal("met; the goal lies inside the interval", goal.Verdict(4, Around(3, 6)));
        Assert.Equal("met; the goal lies inside the interval", goal.Verdict(4, Around(3, double.PositiveInfinity)));
        Assert.Equal("NOT met; the goal lies inside the interval", goal.Verdict(6, Around(5, 7)));
        Assert.Equal("NOT met, interval wholly outside", goal.Verdict(6, Around(5.01, 7)));
    }
}
