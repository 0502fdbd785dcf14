namespace LaunchLogger.Prescribed.Sensors;

/// <summary>How far an undriven wheel's turning falls behind the road while the car speeds up:
/// the slip that spins the wheel up.</summary>
/// <remarks>Nothing but the tyre turns an undriven wheel, so its angular acceleration α = a / r
/// needs a longitudinal tyre force F = I·α / r = I·a / r². A tyre passes force in proportion to
/// its slip and its load (the linear part of the force–slip curve; H. B. Pacejka, "Tire and
/// Vehicle Dynamics", ch. 1): F = C·N·s, so the wheel's tread runs slower than the road by
/// <code>s = I·a / (r²·N·C)</code>
/// and the pulses count the road's distance times (1 − s). Only while the car speeds up: slowing,
/// the wheel is braked and its slip is the brake's (<see cref="BrakeSlip"/>)
/// (a driven wheel's slip is <see cref="DriveSlip"/>'s: its axle torque, not the tyre, spins it
/// up, so its tyre passes only the drive force).</remarks>
/// <param name="InertiaKgM2">I: the wheel's rotational inertia with tyre, brake disc and hub, kg·m².</param>
/// <param name="RadiusM">r: its rolling radius, m.</param>
/// <param name="LoadN">N: the load on the wheel, N.</param>
/// <param name="SlipStiffness">C: longitudinal force per unit slip per unit load.</param>
public sealed record SpinUpLag(double InertiaKgM2, double RadiusM, double LoadN, double SlipStiffness)
{
    /// <summary>I / (r²·N·C): the slip per m/s² of acceleration, s²/m.</summary>
    public double PerMps2 => InertiaKgM2 / (RadiusM * RadiusM * LoadN * SlipStiffness);

    /// <summary>s at an acceleration of <paramref name="accelMps2"/>: 0 unless speeding up.</summary>
    public double At(double accelMps2) => PerMps2 * Math.Max(accelMps2, 0);

    /// <summary>One wheel drawn from plausible ranges for a road car's undriven wheel (every draw
    /// uniform): I 0.7–1.4 kg·m² (a 15–18 inch alloy wheel with its tyre about 0.8–1.2 kg·m²,
    /// the disc and hub a little more; from memory), N 2.5–5.5 kN (a quarter of a 1,000–2,000 kg
    /// car, less or more by the load moving rearward under drive; common practice), C 15–30 per
    /// unit slip (passenger tyres; from memory). r is the rolling radius of the record's own tyre,
    /// <paramref name="rollingCircumferenceM"/> / 2π. The slip per m/s² then spans
    /// about 4·10⁻⁵ to 5·10⁻⁴ s²/m.</summary>
    public static SpinUpLag Draw(Random random, double rollingCircumferenceM)
    {
        ArgumentNullException.ThrowIfNull(random);
        double inertia = 0.7 + (0.7 * random.NextDouble());
        double load = 2500 + (3000 * random.NextDouble());
        double stiffness = 15 + (15 * random.NextDouble());
        return new SpinUpLag(inertia, rollingCircumferenceM / (2 * Math.PI), load, stiffness);
    }
}
