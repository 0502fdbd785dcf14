namespace LaunchLogger.Decoding.Braking;

/// <summary>What is known of the braked pickup wheel's tyre: its longitudinal slip stiffness per
/// unit load C lies uniformly between <paramref name="LowStiffness"/> and
/// <paramref name="HighStiffness"/>, and its force over its load, as a multiple of the car's
/// deceleration over g0 (its share of the braking), uniformly between <paramref name="LowShare"/>
/// and <paramref name="HighShare"/>, the two independent. A braked tyre turns slower than the road
/// passes by slip = (braking force ÷ load) ÷ C (the linear range; H. B. Pacejka, "Tire and Vehicle
/// Dynamics", ch. 1), so pulses count a stop short by v0²/(2·g0)·(share/C).</summary>
/// <param name="LowStiffness">Softest C.</param>
/// <param name="HighStiffness">Stiffest C; <see cref="double.PositiveInfinity"/> with the low one
/// for a wheel that does not slip (<see cref="None"/>).</param>
/// <param name="LowShare">Least share of the braking the wheel's tyre works at.</param>
/// <param name="HighShare">Most.</param>
public sealed record BrakeSlipPrior(double LowStiffness, double HighStiffness, double LowShare = 1, double HighShare = 1)
{
    /// <summary>Car tyres: C 15–30 per unit slip (from memory; the same chapter's range), on a
    /// wheel of either axle (<see cref="EitherAxleLowShare"/>–<see cref="EitherAxleHighShare"/>).</summary>
    public static BrakeSlipPrior CarTyres { get; } = new(15, 30, EitherAxleLowShare, EitherAxleHighShare);

    /// <summary>A wheel that turns with the road under braking (a test's rigid wheel).</summary>
    public static BrakeSlipPrior None { get; } = new(double.PositiveInfinity, double.PositiveInfinity);

    /// <summary>Least share of the car's deceleration a wheel of a road car works at, where the
    /// axle is not told. A wheel's force over its load is β / (ψ + χ·D/g0) at the front and
    /// (1 − β) / (1 − ψ − χ·D/g0) at the rear (brake split β front, static front weight ψ,
    /// centre-of-mass height over wheelbase χ: the load moving forward under braking; any
    /// vehicle-dynamics text, e.g. T. D. Gillespie, "Fundamentals of Vehicle Dynamics", ch. 3).
    /// From memory for road cars: β 0.6–0.8, set near the split that brakes both axles alike at
    /// 0.5–1 g, ψ 0.45–0.62, χ 0.15–0.25; at 0.3–0.9 g a front wheel then works at 0.85–1.5 of
    /// the car's deceleration and a rear one at 0.45–1.65, most of both within 0.6–1.3 (a rear
    /// wheel under a split set for hard stops, braking gently, lies below).</summary>
    public const double EitherAxleLowShare = 0.6;

    /// <summary>Most share (<see cref="EitherAxleLowShare"/>).</summary>
    public const double EitherAxleHighShare = 1.3;

    /// <summary>E[1/C]: ln(high/low)/(high − low), 0.0462 for car tyres (as if C were 21.6).</summary>
    public double MeanInverse => double.IsPositiveInfinity(LowStiffness) ? 0
        : HighStiffness <= LowStiffness ? 1 / LowStiffness
        : Math.Log(HighStiffness / LowStiffness) / (HighStiffness - LowStiffness);

    /// <summary>σ of 1/C: E[1/C²] = 1/(low·high), less the mean squared; 0.0093 for car tyres.</summary>
    public double InverseSigma => double.IsPositiveInfinity(LowStiffness) ? 0
        : Math.Sqrt(Math.Max((1 / (LowStiffness * HighStiffness)) - (MeanInverse * MeanInverse), 0));

    /// <summary>E[share/C], the wheel's slip per unit of the car's deceleration over g0:
    /// E[share]·E[1/C], 0.0439 for car tyres on either axle.</summary>
    public double MeanWheelSlip => 0.5 * (LowShare + HighShare) * MeanInverse;

    /// <summary>The most share/C can be: the highest share over the softest C (0.0867 for car
    /// tyres on either axle); 0 for a wheel that does not slip.</summary>
    public double MostWheelSlip => double.IsPositiveInfinity(LowStiffness) ? 0 : HighShare / LowStiffness;

    /// <summary>σ of share/C: E[share²]·E[1/C²], less the mean squared; 0.0130 for car tyres on
    /// either axle (0.0093 from the tyre alone).</summary>
    public double WheelSlipSigma
    {
        get
        {
            if (double.IsPositiveInfinity(LowStiffness))
            {
                return 0;
            }

            double shareSquared = ((LowShare * LowShare) + (LowShare * HighShare) + (HighShare * HighShare)) / 3;
            double inverseSquared = (InverseSigma * InverseSigma) + (MeanInverse * MeanInverse);
            return Math.Sqrt(Math.Max((shareSquared * inverseSquared) - (MeanWheelSlip * MeanWheelSlip), 0));
        }
    }
}
