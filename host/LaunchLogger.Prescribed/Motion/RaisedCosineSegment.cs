using static System.FormattableString;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>Acceleration rising from zero to a peak as half a cosine wave (a raised cosine), so
/// that the jerk too starts and ends at zero, integrated in closed form.</summary>
/// <remarks>
/// With A the peak, T the duration and ω = π/T, integrating term by term (by hand; any calculus
/// text), u = ωτ:
/// <code>
/// a(τ)  = (A/2)·(1 − cos u) = A·sin²(u/2)
/// Δv(τ) = (A/2)·(τ − sin(u)/ω)            = (A/2)·(u − sin u)/ω
/// Δx(τ) = (A/2)·(τ²/2 − (1 − cos u)/ω²)   = (A/2)·(u²/2 − 2·sin²(u/2))/ω²
/// </code>
/// Near τ = 0 the differences lose digits to cancellation (u − sin u ≈ u³/6, u²/2 − (1 − cos u)
/// ≈ u⁴/24), so for u ≤ 1 they are summed as their Maclaurin series instead, to full precision.
/// Over the whole rise Δv = A·T/2 and Δx = A·T²·(1/4 − 1/π²).
/// </remarks>
public sealed class RaisedCosineSegment : AccelSegment
{
    // Below this u the differences are summed as series: at u = 1 the direct forms keep all but
    // about three bits, and the series' terms fall below 1e-19 of the sum within a dozen.
    private const double SeriesBelow = 1;
    private const int SeriesTerms = 12;
    private readonly double omega;

    /// <summary>Creates a rise from 0 to <paramref name="peakMps2"/> over <paramref name="durationS"/>.</summary>
    public RaisedCosineSegment(double durationS, double peakMps2)
        : base(durationS)
    {
        Peak = peakMps2;
        omega = Math.PI / durationS;
    }

    /// <summary>A, the acceleration at the end, m/s².</summary>
    public double Peak { get; }

    /// <inheritdoc/>
    public override double AccelMps2(double tauS)
    {
        double half = Math.Sin(0.5 * omega * tauS);
        return Peak * half * half;
    }

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => 0.5 * Peak * UMinusSin(omega * tauS) / omega;

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS) => 0.5 * Peak * HalfUSquaredMinusVersine(omega * tauS) / (omega * omega);

    /// <inheritdoc/>
    public override string Describe() => Invariant($"raised-cosine rise 0→{Peak:0.###} m/s² over {DurationS:0.###} s");

    /// <summary>u − sin u = u³/3! − u⁵/5! + u⁷/7! − …</summary>
    private static double UMinusSin(double u)
    {
        if (Math.Abs(u) > SeriesBelow)
        {
            return u - Math.Sin(u);
        }

        double u2 = u * u;
        double term = u * u2 / 6;
        double sum = 0;
        for (int k = 1; k <= SeriesTerms; k++)
        {
            sum += term;
            term *= -u2 / ((2 * k + 2) * (2 * k + 3));
        }

        return sum;
    }

    /// <summary>u²/2 − (1 − cos u) = u⁴/4! − u⁶/6! + u⁸/8! − …</summary>
    private static double HalfUSquaredMinusVersine(double u)
    {
        if (Math.Abs(u) > SeriesBelow)
        {
            double half = Math.Sin(0.5 * u);
            return (0.5 * u * u) - (2 * half * half);
        }

        double u2 = u * u;
        double term = u2 * u2 / 24;
        double sum = 0;
        for (int k = 2; k <= SeriesTerms + 1; k++)
        {
            sum += term;
            term *= -u2 / ((2 * k + 1) * (2 * k + 2));
        }

        return sum;
    }
}
