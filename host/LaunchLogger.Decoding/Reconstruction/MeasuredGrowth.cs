namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The tyre's growth with speed as a fit over a record that opens moving measured it.</summary>
/// <param name="Sigma">σ of the growth at 30 m/s, a fraction.</param>
/// <param name="ScaleCorrelation">Correlation of the growth with the scale.</param>
/// <param name="PulseGrowthM">Distance the growth adds by each pulse observation, m.</param>
internal sealed record MeasuredGrowth(double Sigma, double ScaleCorrelation, double[] PulseGrowthM);
