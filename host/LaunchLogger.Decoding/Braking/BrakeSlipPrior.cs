namespace LaunchLogger.Decoding.Braking;

/// <summary>What is known of the braked pickup wheel's tyre: its longitudinal slip stiffness per
/// unit load C lies uniformly between <paramref name="LowStiffness"/> and
/// <paramref name="HighStiffness"/>. A braked tyre turns slower than the road passes by
/// slip = (braking force ÷ load) ÷ C (the linear range; H. B. Pacejka, "Tire and Vehicle
/// Dynamics", ch. 1), so pulses count a stop short by v0²/(2·g0)·(1/C).</summary>
/// <param name="LowStiffness">Softest C.</param>
/// <param name="HighStiffness">Stiffest C; <see cref="double.PositiveInfinity"/> with the low one
/// for a wheel that does not slip (<see cref="None"/>).</param>
public sealed record BrakeSlipPrior(double LowStiffness, double HighStiffness)
{
    /// <summary>Car tyres: C 15–30 per unit slip (from memory; the same chapter's range).</summary>
    public static BrakeSlipPrior CarTyres { get; } = new(15, 30);

    /// <summary>A wheel that turns with the road under braking (a test's rigid wheel).</summary>
    public static BrakeSlipPrior None { get; } = new(double.PositiveInfinity, double.PositiveInfinity);

    /// <summary>E[1/C]: ln(high/low)/(high − low), 0.0462 for car tyres (as if C were 21.6).</summary>
    public double MeanInverse => double.IsPositiveInfinity(LowStiffness) ? 0
        : HighStiffness <= LowStiffness ? 1 / LowStiffness
        : Math.Log(HighStiffness / LowStiffness) / (HighStiffness - LowStiffness);

    /// <summary>σ of 1/C: E[1/C²] = 1/(low·high), less the mean squared; 0.0093 for car tyres.</summary>
    public double InverseSigma => double.IsPositiveInfinity(LowStiffness) ? 0
        : Math.Sqrt(Math.Max((1 / (LowStiffness * HighStiffness)) - (MeanInverse * MeanInverse), 0));
}
