using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Corrections;

/// <summary>Scales figures to standard air (SAE J1349: 25 °C, 99 kPa dry air) with the power
/// correction factor CF.</summary>
/// <remarks>
/// From constant-power kinematics without drag or traction limits (½·m·v² = P·t): the time to a
/// speed goes as P⁻¹, the time to a distance as P^(−1/3) and the speed at a distance as P^(1/3).
/// With P_standard = CF·P_measured: interval times × CF⁻¹, elapsed times × CF^(−1/3), trap
/// speeds × CF^(1/3). A first-order estimate for power-limited running; traction-limited
/// launches gain less than this says.
/// <para>A standing interval timed after the rollout is a speed time less the rollout time, and
/// the rollout time is a distance time (to 1 ft): each part scales by its own exponent,
/// <c>t′_after = t_standstill·CF⁻¹ − t_rollout·CF^(−1/3)</c> with
/// <c>t_rollout = t_standstill − t_after</c>.</para>
/// </remarks>
public static class WeatherCorrection
{
    /// <summary>How the correction is made, in words, for reports.</summary>
    public const string Method = "SAE J1349 power correction factor CF; constant-power scaling: interval times × 1/CF, elapsed times × CF^(-1/3), trap speeds × CF^(1/3); after-rollout intervals = interval × 1/CF − rollout time × CF^(-1/3)";

    /// <summary>Applies the correction to a figure set.</summary>
    public static FigureSet Apply(FigureSet figures, double correctionFactor)
    {
        ArgumentNullException.ThrowIfNull(figures);
        double time = 1 / correctionFactor;
        double elapsed = Math.Pow(correctionFactor, -1.0 / 3);
        double speed = Math.Pow(correctionFactor, 1.0 / 3);
        return figures with
        {
            SpeedIntervals = figures.SpeedIntervals.Select(i => i with
            {
                FromStandstillS = i.FromStandstillS * time,
                FromRolloutS = i.Interval.IsStanding
                    ? (i.FromStandstillS * time) - ((i.FromStandstillS - i.FromRolloutS) * elapsed)
                    : i.FromRolloutS * time,
                UncertaintyS = i.UncertaintyS * time,
                FromRolloutUncertaintyS = i.FromRolloutUncertaintyS * time,
            }).ToList(),
            DistanceMarks = figures.DistanceMarks.Select(m => m with
            {
                FromStandstillS = m.FromStandstillS * elapsed,
                FromRolloutS = m.FromRolloutS * elapsed,
                UncertaintyS = m.UncertaintyS * elapsed,
                FromRolloutUncertaintyS = m.FromRolloutUncertaintyS * elapsed,
                SpeedAtMarkMps = m.SpeedAtMarkMps * speed,
                TrapSpeedMps = m.TrapSpeedMps * speed,
                TrapSpeedUncertaintyMps = m.TrapSpeedUncertaintyMps * speed,
            }).ToList(),
            MeanAccel0To60Mps2 = figures.MeanAccel0To60Mps2 / time,
        };
    }
}
