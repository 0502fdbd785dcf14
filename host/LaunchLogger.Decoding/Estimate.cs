namespace LaunchLogger.Decoding;

/// <summary>An estimated value with its 1-σ standard uncertainty, in the unit the name of the
/// property holding it says.</summary>
/// <param name="Value">The best estimate.</param>
/// <param name="Sigma">Its standard uncertainty (1 σ, ≥ 0).</param>
public readonly record struct Estimate(double Value, double Sigma);
