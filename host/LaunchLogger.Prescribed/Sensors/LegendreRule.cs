using MathNet.Numerics.Integration;

namespace LaunchLogger.Prescribed.Sensors;

/// <summary>An n-point Gauss–Legendre rule whose nodes and weights are worked out once: the
/// same numbers MathNet.Numerics' <see cref="GaussLegendreRule"/> uses, and the same sum.</summary>
/// <remarks>
/// On [a, b], with h = (b − a)/2, c = (b + a)/2 and the rule's nodes ±xᵢ and weights wᵢ on
/// [−1, 1] (Abramowitz &amp; Stegun 25.4.29), for an even n:
/// <code>
/// ∫ₐᵇ f ≈ h·Σᵢ wᵢ·(f(c + h·xᵢ) + f(c − h·xᵢ)),   i = 1 … n/2
/// </code>
/// summed in that order, as <see cref="GaussLegendreRule.Integrate(Func{double, double}, double, double, int)"/>
/// does, so the result is the same to the last bit. That method keeps only the last rule it
/// was asked for and works out any order it has no table for (24 among them) afresh by Newton's
/// method; alternating two orders, as <see cref="WheelPickup"/> does, it did so on every call.
/// </remarks>
public sealed class LegendreRule
{
    private readonly double[] nodes;
    private readonly double[] weights;

    /// <summary>Takes the <paramref name="points"/>-point rule (even) from MathNet.Numerics.</summary>
    public LegendreRule(int points)
    {
        if (points < 2 || points % 2 != 0)
        {
            throw new ArgumentOutOfRangeException(nameof(points), points, "an even number of points");
        }

        // The rule mapped onto [−1, 1] itself (h = 1, c = 0) gives its nodes and weights
        // unchanged: ascending, so the non-negative half is the upper one.
        var rule = new GaussLegendreRule(-1, 1, points);
        int half = points / 2;
        nodes = new double[half];
        weights = new double[half];
        for (int i = 0; i < half; i++)
        {
            nodes[i] = rule.GetAbscissa(half + i);
            weights[i] = rule.GetWeight(half + i);
        }
    }

    /// <summary>∫ <paramref name="f"/> from <paramref name="a"/> to <paramref name="b"/>.</summary>
    public double Integrate(Func<double, double> f, double a, double b)
    {
        double h = 0.5 * (b - a);
        double c = 0.5 * (b + a);
        double sum = 0;
        for (int i = 0; i < nodes.Length; i++)
        {
            double dx = h * nodes[i];
            sum += weights[i] * (f(c + dx) + f(c - dx));
        }

        return h * sum;
    }
}
