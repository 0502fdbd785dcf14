using LaunchLogger.Cli.Bench;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>The exact interval the bench prints beside a coverage figure, against its closed
/// forms, its definition and published values.</summary>
public class CoverageIntervalTests
{
    /// <summary>With none or all of n covered the exact bounds have closed forms: upper
    /// 1 − (α/2)^(1/n) for 0 of n, lower (α/2)^(1/n) for n of n (Clopper and Pearson 1934,
    /// Biometrika 26, 404–413: (1 − p)ⁿ = α/2 and pⁿ = α/2).</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(13)]
    [InlineData(62)]
    [InlineData(545)]
    public void None_or_all_covered_have_the_closed_form_bounds(int n)
    {
        (double lowNone, double highNone) = CoverageInterval.ClopperPearson(0, n);
        (double lowAll, double highAll) = CoverageInterval.ClopperPearson(n, n);

        Assert.Equal(0, lowNone);
        Assert.Equal(1 - Math.Pow(0.025, 1.0 / n), highNone, 9);
        Assert.Equal(Math.Pow(0.025, 1.0 / n), lowAll, 9);
        Assert.Equal(1, highAll);
    }

    /// <summary>The bounds are where the binomial tails hold α/2 each (the interval's definition,
    /// Clopper and Pearson 1934): P(X ≥ k | lower) = 0.025 and P(X ≤ k | upper) = 0.025, the
    /// tails summed term by term here from the binomial probabilities.</summary>
    [Theory]
    [InlineData(12, 13)]
    [InlineData(15, 16)]
    [InlineData(74, 78)]
    [InlineData(540, 545)]
    [InlineData(3, 20)]
    public void The_bounds_leave_two_and_a_half_percent_in_each_binomial_tail(int k, int n)
    {
        (double low, double high) = CoverageInterval.ClopperPearson(k, n);

        Assert.Equal(0.025, BinomialTail(n, low, from: k, to: n), 9);
        Assert.Equal(0.025, BinomialTail(n, high, from: 0, to: k), 9);
    }

    /// <summary>Published exact intervals: Newcombe (1998), Statistics in Medicine 17, 857–872,
    /// table I, method 5 (Clopper–Pearson), to the four decimals printed there (from memory).</summary>
    [Theory]
    [InlineData(81, 263, 0.2527, 0.3676)]
    [InlineData(15, 148, 0.0578, 0.1617)]
    [InlineData(0, 20, 0.0000, 0.1684)]
    [InlineData(1, 29, 0.0009, 0.1776)]
    public void Published_intervals_are_reproduced(int k, int n, double lower, double upper)
    {
        (double low, double high) = CoverageInterval.ClopperPearson(k, n);

        Assert.Equal(lower, low, 4);
        Assert.Equal(upper, high, 4);
    }

    [Theory]
    [InlineData(-1, 10)]
    [InlineData(11, 10)]
    [InlineData(0, 0)]
    public void Impossible_counts_are_refused(int k, int n) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => CoverageInterval.ClopperPearson(k, n));

    /// <summary>One run of 13 outside ±2σ (92.3 %) is what an honest σ gives about half the time
    /// (1 − 0.95¹³ ≈ 49 %): the goal line must say that 95 % lies inside the interval. Sixty of 78
    /// (76.9 %) cannot be a chance draw from 95 %: the line must say the coverage is below it.</summary>
    [Fact]
    public void A_short_coverage_says_whether_its_runs_can_judge_the_goal()
    {
        string? oneOfThirteen = BenchAccuracyCommand.CoverageShortfall("rollout mark", 13, 12, 13);
        string? farShort = BenchAccuracyCommand.CoverageShortfall("first motion", 78, 60, 70);

        Assert.NotNull(oneOfThirteen);
        Assert.Contains("12 of 13 within ±2σ", oneOfThirteen);
        Assert.Contains("holds 95 %", oneOfThirteen);
        Assert.DoesNotContain("±3σ", oneOfThirteen);
        Assert.NotNull(farShort);
        Assert.Contains("below 95 %", farShort);
        Assert.Contains("70 of 78 within ±3σ", farShort);
        Assert.Contains("below 99 %", farShort);
        Assert.Null(BenchAccuracyCommand.CoverageShortfall("trap", 13, 13, 13));
    }

    /// <summary>A count that holds the goal can come from errors all of one sign: the line gives
    /// the errors' mean in σ with its standard error (sample standard deviation over √n), so a
    /// bias is not read as a chance draw. Here 13 errors of −0.5σ to −2.5σ, one beyond 2σ: mean
    /// −1.0; squared deviations 4 × 0.25 + 0.25 + 2.25 = 3.5, standard deviation √(3.5/12) = 0.540,
    /// standard error 0.540/√13 = 0.150 (worked by hand).</summary>
    [Fact]
    public void A_short_coverage_gives_the_errors_mean_in_sigma_with_its_standard_error()
    {
        double[] z = [-0.5, -0.5, -0.5, -0.5, -1.0, -1.0, -1.0, -1.0, -1.0, -1.0, -1.0, -1.5, -2.5];
        Assert.Equal(-1.0, z.Average(), 12);

        string? line = BenchAccuracyCommand.CoverageShortfall("rollout mark", 13, 12, 13, z);

        Assert.NotNull(line);
        Assert.Contains("holds 95 %", line);
        Assert.Contains("error/σ mean -1.00 ± 0.15", line);
    }

    private static double BinomialTail(int n, double p, int from, int to)
    {
        double sum = 0;
        for (int i = from; i <= to; i++)
        {
            sum += Math.Exp(LogChoose(n, i) + (i * Math.Log(p)) + ((n - i) * Math.Log(1 - p)));
        }

        return sum;
    }

    private static double LogChoose(int n, int k)
    {
        double sum = 0;
        for (int i = 1; i <= k; i++)
        {
            sum += Math.Log(n - k + i) - Math.Log(i);
        }

        return sum;
    }
}
