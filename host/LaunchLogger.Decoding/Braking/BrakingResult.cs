namespace LaunchLogger.Decoding.Braking;

/// <summary>A stop to standstill and its figures.</summary>
public sealed record BrakingResult
{
    /// <summary>Speed at brake onset, m/s.</summary>
    public required double FromMps { get; init; }

    /// <summary>Brake onset on the input's time axis, s, with its σ.</summary>
    public required Estimate OnsetS { get; init; }

    /// <summary>How the onset was found: "brake switch", "brake switch and deceleration" (a
    /// switch whose delay was not measured, and the accelerometer's deceleration; <see cref="BrakeOnsetFusion"/>)
    /// or "deceleration onset".</summary>
    public required string OnsetMethod { get; init; }

    /// <summary>Standstill on the input's time axis, s.</summary>
    public required double StandstillS { get; init; }

    /// <summary>Distance from onset to standstill, m, with its σ.</summary>
    public required Estimate StoppingDistanceM { get; init; }

    /// <summary>What <see cref="StoppingDistanceM"/> includes for the braked wheel's slip, m: where
    /// the pulses carry the distance they count it short by the tyre's slip, as the fusion
    /// measured it against the accelerometer (k_b·∫ v·max(−a, 0) dt, when its σ is at most
    /// <see cref="BrakingAnalyzer.MeasuredSlipShare"/> of the prior's) or as the prior expects it
    /// (∫ max(−a, 0)·v dt / g0 × E[share/C], <see cref="BrakeSlipPrior.MeanWheelSlip"/>); 0 where they do not.</summary>
    public double BrakeSlipCorrectionM { get; init; }

    /// <summary>Mean deceleration over the stop, from_mps² / (2 · stopping distance), m/s².</summary>
    public required double MeanDecelMps2 { get; init; }

    /// <summary>Highest deceleration during the stop, m/s² (positive).</summary>
    public required double PeakDecelMps2 { get; init; }

    /// <summary>Mean fully developed deceleration (UN R13 / R13-H), m/s²; null when the
    /// trajectory does not cover 0.8·v0 to 0.1·v0.</summary>
    public double? MfddMps2 { get; init; }

    /// <summary>Stops corrected to nominal initial speeds (60 mph, 100 km/h, any asked for).</summary>
    public required IReadOnlyList<CorrectedStop> CorrectedStops { get; init; }

    /// <summary>The best 0–60 mph this stop's mean deceleration would allow, s.</summary>
    public required double TractionBound0To60S { get; init; }

    /// <summary>The best 0–100 km/h this stop's mean deceleration would allow, s.</summary>
    public required double TractionBound0To100KmhS { get; init; }
}

/// <summary>A stopping distance corrected to a nominal initial speed.</summary>
/// <param name="Label">E.g. "60-0 mph".</param>
/// <param name="NominalMps">The nominal initial speed, m/s.</param>
/// <param name="CorrectedDistanceM">Stopping distance scaled to it, m; null when the actual speed
/// is too far from the nominal one for the scaling to be honest.</param>
/// <param name="Method">How it was corrected, in words.</param>
public sealed record CorrectedStop(string Label, double NominalMps, double? CorrectedDistanceM, string Method);
