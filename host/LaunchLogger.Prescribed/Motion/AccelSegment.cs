namespace LaunchLogger.Prescribed.Motion;

/// <summary>One piece of a prescribed acceleration history: the acceleration as a function of
/// the time since the piece began, and the speed gained and distance covered by integrating it.</summary>
/// <remarks>
/// From a state (x₀, v₀) at the piece's start, after τ seconds (kinematics, any textbook):
/// <code>
/// v(τ) = v₀ + Δv(τ),   Δv(τ) = ∫₀^τ a(s) ds
/// x(τ) = x₀ + v₀·τ + Δx(τ),   Δx(τ) = ∫₀^τ (τ − s)·a(s) ds
/// </code>
/// (the second by Cauchy's formula for a repeated integral). Pieces with a closed form override
/// both; others integrate numerically with error control.
/// </remarks>
public abstract class AccelSegment
{
    /// <summary>Creates a piece lasting <paramref name="durationS"/> seconds.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The duration is not positive and finite.</exception>
    protected AccelSegment(double durationS)
    {
        if (!(durationS > 0) || !double.IsFinite(durationS))
        {
            throw new ArgumentOutOfRangeException(nameof(durationS), durationS, "a segment lasts a positive, finite time");
        }

        DurationS = durationS;
    }

    /// <summary>How long the piece lasts, s.</summary>
    public double DurationS { get; }

    /// <summary>Longitudinal acceleration τ seconds into the piece, m/s².</summary>
    public abstract double AccelMps2(double tauS);

    /// <summary>Δv(τ): speed gained in the first τ seconds, m/s.</summary>
    public abstract double SpeedGainMps(double tauS);

    /// <summary>Δx(τ): distance covered in the first τ seconds beyond v₀·τ, m.</summary>
    public abstract double DistanceGainM(double tauS);

    /// <summary>A few words for listings.</summary>
    public abstract string Describe();
}
