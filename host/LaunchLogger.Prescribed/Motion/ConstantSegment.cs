using static System.FormattableString;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>Constant acceleration: Δv = a·τ, Δx = a·τ²/2 (kinematics, any textbook).</summary>
public sealed class ConstantSegment : AccelSegment
{
    /// <summary>Creates the piece.</summary>
    public ConstantSegment(double durationS, double accelMps2)
        : base(durationS)
    {
        Accel = accelMps2;
    }

    /// <summary>The acceleration, m/s².</summary>
    public double Accel { get; }

    /// <inheritdoc/>
    public override double AccelMps2(double tauS) => Accel;

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => Accel * tauS;

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS) => 0.5 * Accel * tauS * tauS;

    /// <inheritdoc/>
    public override string Describe() => Invariant($"constant {Accel:0.###} m/s² for {DurationS:0.###} s");
}
