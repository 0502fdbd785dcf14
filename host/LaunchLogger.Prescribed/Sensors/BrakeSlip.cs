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
/// then misses ∫ s·v dt = v0² / (2·g0·C) of it, whatever the deceleration's shape. On a wheel of
/// a <see cref="BrakedAxle"/> its tyre works at that axle's force over its load instead
/// (<see cref="BrakedAxle.WorkAt"/> times D / g0). The whole deceleration is taken as the
/// brakes' (drag and rolling resistance, which the tyres do not pass, are left in: a few per cent
/// of the slip at motorway speed). The linear law only: near the grip limit a tyre slips more per
/// unit of force, and under ABS by 5–20 %.</remarks>
/// <param name="SlipStiffness">C: longitudinal force per unit slip per unit load.</param>
/// <param name="Axle">The axle the wheel is on, with the car's brake split and load; null for a
/// wheel whose tyre works at the car's deceleration.</param>
public sealed record BrakeSlip(double SlipStiffness, BrakedAxle? Axle = null)
{
    /// <summary>s at an acceleration of <paramref name="accelMps2"/>: 0 unless slowing.</summary>
    public double At(double accelMps2)
    {
        double decel = Math.Max(-accelMps2, 0);
        double work = Axle?.WorkAt(decel) ?? 1;
        return work * decel / TruthUnits.StandardGravity / SlipStiffness;
    }

    /// <summary>One tyre drawn uniform in C 15–30 per unit slip (passenger tyres; from memory,
    /// the same range <see cref="SpinUpLag.Draw"/> takes).</summary>
    public static BrakeSlip Draw(Random random)
    {
        ArgumentNullException.ThrowIfNull(random);
        return new BrakeSlip(15 + (15 * random.NextDouble()));
    }
}

/// <summary>One axle of a braked car: its share of the brake force and of the load.</summary>
/// <remarks>Under a deceleration D the load moves forward by m·D·h/L (the pitch moment of the
/// braking force at the centre of mass's height h over the wheelbase L; any vehicle-dynamics
/// text, e.g. T. D. Gillespie, "Fundamentals of Vehicle Dynamics", ch. 3, from memory), so the
/// front axle carries (ψ + χ·D/g0) of the weight and the rear (1 − ψ − χ·D/g0), ψ the front's
/// static share and χ = h/L; the brakes split their force by a fixed bias β (front). A wheel's
/// force over its load, over the car's D/g0, is then β / (ψ + χ·D/g0) at the front and
/// (1 − β) / (1 − ψ − χ·D/g0) at the rear: under a front bias above the weight the car carries
/// forward, a rear tyre works less than the car's deceleration and a front one more.</remarks>
/// <param name="BrakeShare">This axle's share of the brake force.</param>
/// <param name="StaticLoadShare">Its share of the weight at rest.</param>
/// <param name="LoadPerG">The share of the weight it gains per g of deceleration (+χ at the
/// front, −χ at the rear).</param>
public sealed record BrakedAxle(double BrakeShare, double StaticLoadShare, double LoadPerG)
{
    /// <summary>The front axle of a car with front bias <paramref name="frontBias"/>, static front
    /// weight share <paramref name="frontWeight"/> and centre-of-mass height over wheelbase
    /// <paramref name="heightOverWheelbase"/>.</summary>
    public static BrakedAxle Front(double frontBias, double frontWeight, double heightOverWheelbase) => new(frontBias, frontWeight, heightOverWheelbase);

    /// <summary>The rear axle of the same car.</summary>
    public static BrakedAxle Rear(double frontBias, double frontWeight, double heightOverWheelbase) => new(1 - frontBias, 1 - frontWeight, -heightOverWheelbase);

    /// <summary>This axle's force over its load, as a multiple of the car's deceleration over g0,
    /// at a deceleration of <paramref name="decelMps2"/>.</summary>
    public double WorkAt(double decelMps2) => BrakeShare / Math.Max(StaticLoadShare + (LoadPerG * decelMps2 / TruthUnits.StandardGravity), 0.05);
}
