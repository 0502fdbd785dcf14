using static System.FormattableString;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>Acceleration changing linearly (constant jerk j): a = a₀ + j·τ,
/// Δv = a₀·τ + j·τ²/2, Δx = a₀·τ²/2 + j·τ³/6 (kinematics, any textbook).</summary>
public sealed class RampSegment : AccelSegment
{
    /// <summary>Creates a ramp from <paramref name="fromMps2"/> to <paramref name="toMps2"/>
    /// over <paramref name="durationS"/>.</summary>
    public RampSegment(double durationS, double fromMps2, double toMps2)
        : base(durationS)
    {
        From = fromMps2;
        To = toMps2;
        Jerk = (toMps2 - fromMps2) / durationS;
    }

    /// <summary>Acceleration at the start, m/s².</summary>
    public double From { get; }

    /// <summary>Acceleration at the end, m/s².</summary>
    public double To { get; }

    /// <summary>The constant jerk, m/s³.</summary>
    public double Jerk { get; }

    /// <inheritdoc/>
    public override double AccelMps2(double tauS) => From + (Jerk * tauS);

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => (From * tauS) + (0.5 * Jerk * tauS * tauS);

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS) => (0.5 * From * tauS * tauS) + (Jerk * tauS * tauS * tauS / 6);

    /// <inheritdoc/>
    public override string Describe() => Invariant($"ramp {From:0.###}→{To:0.###} m/s² over {DurationS:0.###} s");
}
