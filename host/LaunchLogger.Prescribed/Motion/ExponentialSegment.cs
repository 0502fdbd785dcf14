using static System.FormattableString;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>Acceleration approaching a final value exponentially (a first-order lag, as a
/// falling thrust curve or a building brake pressure does).</summary>
/// <remarks>
/// With a∞ the final value, a₀ the start value and T the time constant, integrating term by term
/// (any calculus text):
/// <code>
/// a(τ)  = a∞ + (a₀ − a∞)·e^(−τ/T)
/// Δv(τ) = a∞·τ + (a₀ − a∞)·T·(1 − e^(−τ/T))
/// Δx(τ) = a∞·τ²/2 + (a₀ − a∞)·T·(τ − T·(1 − e^(−τ/T)))
/// </code>
/// For τ ≪ T the bracketed forms lose digits to cancellation, so they use expm1.
/// </remarks>
public sealed class ExponentialSegment : AccelSegment
{
    /// <summary>Creates the piece.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The time constant is not positive.</exception>
    public ExponentialSegment(double durationS, double fromMps2, double finalMps2, double timeConstantS)
        : base(durationS)
    {
        if (!(timeConstantS > 0) || !double.IsFinite(timeConstantS))
        {
            throw new ArgumentOutOfRangeException(nameof(timeConstantS), timeConstantS, "the time constant must be positive and finite");
        }

        From = fromMps2;
        Final = finalMps2;
        TimeConstantS = timeConstantS;
    }

    /// <summary>a₀, m/s².</summary>
    public double From { get; }

    /// <summary>a∞, m/s².</summary>
    public double Final { get; }

    /// <summary>T, s.</summary>
    public double TimeConstantS { get; }

    /// <inheritdoc/>
    public override double AccelMps2(double tauS) => Final + ((From - Final) * Math.Exp(-tauS / TimeConstantS));

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => (Final * tauS) + ((From - Final) * TimeConstantS * OneMinusExp(tauS));

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS)
    {
        double t = TimeConstantS;
        double u = tauS / t;

        // τ − T·(1 − e^(−u)) = T·(u − 1 + e^(−u)) = T·(u + expm1(−u)); for small u use its series.
        double tail = u < 1e-3 ? u * u * (0.5 - (u / 6) + (u * u / 24)) : u + ExpM1(-u);
        return (0.5 * Final * tauS * tauS) + ((From - Final) * t * t * tail);
    }

    /// <inheritdoc/>
    public override string Describe() => Invariant($"exponential {From:0.###}→{Final:0.###} m/s² (T {TimeConstantS:0.###} s) for {DurationS:0.###} s");

    private double OneMinusExp(double tauS) => -ExpM1(-tauS / TimeConstantS);

    // e^x − 1 without cancellation near 0 (series below 1e-5, direct above).
    private static double ExpM1(double x) => Math.Abs(x) < 1e-5 ? x + (x * x / 2) + (x * x * x / 6) : Math.Exp(x) - 1;
}
