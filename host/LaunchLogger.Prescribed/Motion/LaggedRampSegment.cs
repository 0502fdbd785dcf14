using static System.FormattableString;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>A launch's take-up through a first-order lag: the driver's demand ramps linearly
/// (k = A/T, rising to the peak A in T), and the acceleration follows it through a lag λ (clutch
/// and tyre compliance), until the acceleration itself reaches the peak, later than T by up to λ.
/// Integrated in closed form.</summary>
/// <remarks>
/// The lag equation λ·a′ + a = k·τ with a(0) = 0 (a first-order system driven by a ramp; any
/// control text) has the solution below; integrating it term by term (by hand), with u = τ/λ:
/// <code>
/// a(τ)  = k·(τ − λ·(1 − e^(−u)))                 = k·λ ·g₁(u),  g₁(u) = u − 1 + e^(−u)
/// Δv(τ) = k·(τ²/2 − λ·τ + λ²·(1 − e^(−u)))       = k·λ²·g₂(u),  g₂(u) = u²/2 − u + 1 − e^(−u)
/// Δx(τ) = k·(τ³/6 − λ·τ²/2 + λ²·τ − λ³·(1 − e^(−u))) = k·λ³·g₃(u),  g₃(u) = u³/6 − u²/2 + u − 1 + e^(−u)
/// </code>
/// Each gₙ is the exponential series with its first n + 1 terms taken off, gₙ(u) =
/// (−1)^(n+1)·Σ_{j>n} (−u)^j/j!, so a starts as k·τ²/(2λ) (the jerk from zero), Δv as k·τ³/(6λ)
/// and Δx as k·τ⁴/(24λ); for u ≤ 2 the differences lose digits to cancellation and are summed as
/// that series instead. The segment ends at τₚ where a = A, the root of λ·g₁(τₚ/λ) = T (one
/// root, in (T, T + λ): g₁ rises, g₁′ = 1 − e^(−u)), found by Newton's method.
/// At τₚ the acceleration is A (the next piece starts from it: continuous); the jerk there is
/// k·(1 − e^(−τₚ/λ)), and whatever follows takes over from it with a step, as after a linear
/// ramp (its jerk k steps to the next piece's).
/// </remarks>
public sealed class LaggedRampSegment : AccelSegment
{
    // Below this u the gₙ are summed as series; at u = 2 the terms fall below 1e-19 of the sum
    // within 30, and above it the direct forms keep all but a couple of bits.
    private const double SeriesBelow = 2;
    private const int SeriesTerms = 30;
    private const int NewtonSteps = 100;

    /// <summary>Creates a take-up whose demand ramps to <paramref name="peakMps2"/> in
    /// <paramref name="rampS"/>, through a lag of <paramref name="lagS"/>; it lasts until the
    /// acceleration reaches the peak.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A time is not positive and finite, or the
    /// peak is not positive and finite.</exception>
    public LaggedRampSegment(double rampS, double peakMps2, double lagS)
        : base(TimeToPeak(rampS, lagS))
    {
        if (!(peakMps2 > 0) || !double.IsFinite(peakMps2))
        {
            throw new ArgumentOutOfRangeException(nameof(peakMps2), peakMps2, "the peak is positive and finite");
        }

        RampS = rampS;
        Peak = peakMps2;
        LagS = lagS;
        RateMps3 = peakMps2 / rampS;
    }

    /// <summary>T, the time the driver's demand takes to reach the peak, s.</summary>
    public double RampS { get; }

    /// <summary>A, the acceleration at the end, m/s².</summary>
    public double Peak { get; }

    /// <summary>λ, the lag's time constant, s.</summary>
    public double LagS { get; }

    /// <summary>k = A/T, the demand's rate of rise, m/s³.</summary>
    public double RateMps3 { get; }

    /// <summary>The jerk at the end, k·(1 − e^(−τₚ/λ)), m/s³ (the piece after it starts from its own).</summary>
    public double EndJerkMps3 => -RateMps3 * ExpTail(DurationS / LagS, 1);

    /// <inheritdoc/>
    public override double AccelMps2(double tauS) => RateMps3 * LagS * ExpTail(tauS / LagS, 2);

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => -RateMps3 * LagS * LagS * ExpTail(tauS / LagS, 3);

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS) => RateMps3 * LagS * LagS * LagS * ExpTail(tauS / LagS, 4);

    /// <inheritdoc/>
    public override string Describe() => Invariant($"lagged ramp 0→{Peak:0.###} m/s² (demand over {RampS:0.###} s, lag {LagS:0.###} s) over {DurationS:0.###} s");

    /// <summary>τₚ: when a = A, the root of λ·g₁(τ/λ) = T.</summary>
    private static double TimeToPeak(double rampS, double lagS)
    {
        if (!(rampS > 0) || !double.IsFinite(rampS))
        {
            throw new ArgumentOutOfRangeException(nameof(rampS), rampS, "the ramp lasts a positive, finite time");
        }

        if (!(lagS > 0) || !double.IsFinite(lagS))
        {
            throw new ArgumentOutOfRangeException(nameof(lagS), lagS, "the lag is positive and finite");
        }

        // g₁ is convex and rising, so Newton's method from the right of the root (u = T/λ + 1,
        // where g₁ > T/λ) falls monotonically onto it.
        double target = rampS / lagS;
        double u = target + 1;
        for (int i = 0; i < NewtonSteps; i++)
        {
            double step = (ExpTail(u, 2) - target) / -ExpTail(u, 1);
            if (!(step > 0) || u - step == u)
            {
                break;
            }

            u -= step;
        }

        return u * lagS;
    }

    /// <summary>Σ_{j ≥ m} (−u)^j/j!: e^(−u) with its first m terms taken off, without cancellation.</summary>
    private static double ExpTail(double u, int m)
    {
        if (u > SeriesBelow)
        {
            double direct = Math.Exp(-u);
            double term = 1;
            for (int j = 0; j < m; j++)
            {
                direct -= term;
                term *= -u / (j + 1);
            }

            return direct;
        }

        double first = 1;
        for (int j = 1; j <= m; j++)
        {
            first *= -u / j;
        }

        double sum = 0;
        double t = first;
        for (int j = m; j < m + SeriesTerms; j++)
        {
            sum += t;
            t *= -u / (j + 1);
        }

        return sum;
    }
}
