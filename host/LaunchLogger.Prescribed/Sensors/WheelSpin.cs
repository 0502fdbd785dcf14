namespace LaunchLogger.Prescribed.Sensors;

/// <summary>A driven wheel that spins: its tyre is pushed past the peak of its force–slip curve,
/// the slip runs away, and the driver (or a traction control) brings it back.</summary>
/// <remarks>On top of the ordinary drive slip (<see cref="DriveSlip"/>) the wheel's tread runs
/// faster than the car by κ_spin(τ)·v, τ the time since the car first moved, with
/// <code>κ_spin = κ_peak·(1 − cos(π·u))/2</code>
/// rising over <see cref="RiseS"/> (u from 0 to 1), held at κ_peak for <see cref="HoldS"/> and
/// falling the same way over <see cref="FallS"/>, starting <see cref="AfterS"/> after the car
/// first moved. The slip is a ratio to the car's speed (the longitudinal slip of SAE J670,
/// (ω·r − v)/v; from memory), so near standstill the wheel runs ahead by little in m/s — the
/// hard case for a finder. A tyre's force peaks at a slip ratio of about 0.1–0.2 (J. Y. Wong,
/// "Theory of Ground Vehicles", ch. 1, and H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1;
/// from memory); a spin is a slip well beyond that, 0.3–1 and more. Only for a driven wheel: an
/// undriven wheel has no torque to run away with.</remarks>
/// <param name="AfterS">When the spin begins, s after first motion.</param>
/// <param name="PeakSlip">κ_peak: the slip ratio the spin reaches.</param>
/// <param name="RiseS">How long the slip takes to rise to κ_peak, s (0: at once).</param>
/// <param name="HoldS">How long it stays at κ_peak, s.</param>
/// <param name="FallS">How long it takes to fall back, s (0: at once).</param>
public sealed record WheelSpin(double AfterS, double PeakSlip, double RiseS, double HoldS, double FallS)
{
    /// <summary>When the spin is over, s after first motion.</summary>
    public double EndsAfterS => AfterS + RiseS + HoldS + FallS;

    /// <summary>κ_spin at <paramref name="sinceMotionS"/> s after first motion.</summary>
    public double At(double sinceMotionS)
    {
        double tau = sinceMotionS - AfterS;
        if (tau < 0 || sinceMotionS >= EndsAfterS)
        {
            return 0;
        }

        if (tau < RiseS)
        {
            return PeakSlip * 0.5 * (1 - Math.Cos(Math.PI * tau / RiseS));
        }

        tau -= RiseS;
        if (tau < HoldS)
        {
            return PeakSlip;
        }

        tau -= HoldS;
        return PeakSlip * 0.5 * (1 + Math.Cos(Math.PI * tau / FallS));
    }

    /// <summary>A spin drawn uniform in the ranges a hard launch shows: beginning 0–0.2 s after
    /// first motion, κ_peak 0.3–1, rising in 0.02–0.1 s, held 0.05–0.3 s, falling in 0.05–0.1 s
    /// (0.12–0.5 s past the peak in all; our figures).</summary>
    public static WheelSpin Draw(Random random)
    {
        ArgumentNullException.ThrowIfNull(random);
        return new WheelSpin(
            0.2 * random.NextDouble(),
            0.3 + (0.7 * random.NextDouble()),
            0.02 + (0.08 * random.NextDouble()),
            0.05 + (0.25 * random.NextDouble()),
            0.05 + (0.05 * random.NextDouble()));
    }
}
