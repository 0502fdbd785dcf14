using LaunchLogger.Prescribed.Sensors;
using MathNet.Numerics.Integration;

namespace LaunchLogger.Prescribed.Tests.Sensors;

/// <summary>The pickup's kept Gauss–Legendre rules against MathNet.Numerics' own and against the
/// rule's exactness on polynomials.</summary>
public class LegendreRuleTests
{
    public static TheoryData<string, Func<double, double>, double, double> Integrands => new()
    {
        { "sine over a chunk", Math.Sin, 0.3, 0.35 },
        { "a wheel's rate", t => (12 + (3 * t)) / (1.9 * (1 + (2e-5 * (12 + (3 * t)) * (12 + (3 * t))))), 4.1, 4.15 },
        { "a decaying exponential", t => Math.Exp(-t / 0.05), 0, 0.4 },
        { "a rational function, reversed", t => 1 / (1 + (t * t)), 2, -1 },
    };

    [Theory]
    [MemberData(nameof(Integrands))]
    public void The_kept_rules_give_MathNets_sums_to_the_last_bit(string name, Func<double, double> f, double a, double b)
    {
        // The reference library itself (MathNet.Numerics 5, GaussLegendreRule.Integrate): the
        // pickup's edges are root-found on these sums, so they must not move by a bit.
        foreach (int points in new[] { 12, 24 })
        {
            double expected = GaussLegendreRule.Integrate(f, a, b, points);
            Assert.True(expected == new LegendreRule(points).Integrate(f, a, b), $"{name}, {points} points");
        }
    }

    [Theory]
    [InlineData(12)]
    [InlineData(24)]
    public void An_n_point_rule_is_exact_for_polynomials_of_degree_2n_minus_1(int points)
    {
        // Abramowitz & Stegun 25.4.29: Gauss–Legendre with n points is exact to degree 2n − 1;
        // ∫₀² t^(2n−1) dt = 2^(2n)/(2n) by hand.
        int degree = (2 * points) - 1;
        double exact = Math.Pow(2, degree + 1) / (degree + 1);
        Assert.Equal(1, new LegendreRule(points).Integrate(t => Math.Pow(t, degree), 0, 2) / exact, 12);
    }

    [Fact]
    public void Only_an_even_rule_is_kept()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new LegendreRule(13));
        Assert.Throws<ArgumentOutOfRangeException>(() => new LegendreRule(0));
    }
}
