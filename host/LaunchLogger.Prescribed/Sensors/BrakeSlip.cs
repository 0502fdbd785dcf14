using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Sensors;

/// <summary>How much slower a braked wheel turns than the road passes: the longitudinal slip its
/// tyre needs to pass the braking force.</summary>
/// <remarks>A tyre passes force in proportion to its slip and its load (the linear part of the
/// force–slip curve; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1): F = C·N·s. With the
/// braking shared so that every tyre works at the car's deceleration D over g0 (F / N = D / g0),
/// its tread runs slower than the road by
/// <code>s = max(−a, 0) / (g0·C)</code>
/// and the pulses count the road's distance times (1 − s). Over a whole stop from v0 the wheel
/// then misses ∫ s·v dt = v0² / (2·g0·C) of it, whatever the deceleration's shape. The whole
/// deceleration is taken as the brakes' (drag and rolling resistance, which the tyres do not
/// pass, are left in: a few per cent of the slip at motorway speed). The linear law only: near
/// the grip limit a tyre slips more per unit of force, and under ABS by 5–20 %.</remarks>
/// <param name="SlipStiffness">C: longitudinal force per unit slip per unit load.</param>
public sealed record BrakeSlip(double SlipStiffness)
{
    /// <summary>s at an acceleration of <paramref name="accelMps2"/>: 0 unless slowing.</summary>
    public double At(double accelMps2) => Math.Max(-accelMps2, 0) / TruthUnits.StandardGravity / SlipStiffness;

    /// <summary>One tyre drawn uniform in C 15–30 per unit slip (passenger tyres; from memory,
    /// the same range <see cref="SpinUpLag.Draw"/> takes).</summary>
    public static BrakeSlip Draw(Random random)
    {
        ArgumentNullException.ThrowIfNull(random);
        return new BrakeSlip(15 + (15 * random.NextDouble()));
    }
}
