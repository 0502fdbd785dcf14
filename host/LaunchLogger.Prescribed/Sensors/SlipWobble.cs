namespace LaunchLogger.Prescribed.Sensors;

/// <summary>A driven wheel whose slip swings to and fro across its tyre's grip peak: past the
/// peak the force falls, the wheel runs up, the slip overshoots and the tyre bites again, a
/// burst every few tens of milliseconds.</summary>
/// <remarks>On top of the ordinary drive slip (<see cref="DriveSlip"/>, which sets where the
/// swing is centred) the wheel's tread runs faster than the car by κ_w(τ)·v, τ the time since the
/// car first moved, with
/// <code>κ_w = A·sin(2π·τ / P)</code>
/// for <see cref="Cycles"/> whole periods P from first motion, 0 after. The slip is a ratio to
/// the car's speed (the longitudinal slip of SAE J670, (ω·r − v)/v; from memory). Over whole
/// periods the swing adds nothing on average to the slip, so a wheel centred at its tyre's peak
/// slip (0.1–0.2 on dry roads: J. Y. Wong, "Theory of Ground Vehicles", ch. 1; H. B. Pacejka,
/// "Tire and Vehicle Dynamics", ch. 1; from memory) and swinging by A spends half its time past
/// the peak. The figures are ours. Only for a driven wheel.</remarks>
/// <param name="Amplitude">A: the slip ratio's swing either side of the drive slip.</param>
/// <param name="PeriodS">P, s.</param>
/// <param name="Cycles">How many whole periods the swing lasts.</param>
public sealed record SlipWobble(double Amplitude, double PeriodS, int Cycles)
{
    /// <summary>When the swing is over, s after first motion.</summary>
    public double EndsAfterS => PeriodS * Cycles;

    /// <summary>κ_w at <paramref name="sinceMotionS"/> s after first motion.</summary>
    public double At(double sinceMotionS) =>
        sinceMotionS < 0 || sinceMotionS >= EndsAfterS ? 0 : Amplitude * Math.Sin(2 * Math.PI * sinceMotionS / PeriodS);
}
