namespace LaunchLogger.Decoding.Verdicts;

/// <summary>The best 0–60 mph and 0–100 km/h a car's braking grip would allow, from a stop.</summary>
/// <param name="Source">Which stop (log and run).</param>
/// <param name="MeanDecelMps2">The stop's mean deceleration, m/s².</param>
/// <param name="Bound0To60S">The bound on 0–60 mph, s.</param>
/// <param name="Bound0To100KmhS">The bound on 0–100 km/h, s.</param>
/// <param name="Basis">Why the stop counts as one at the grip limit (see <see cref="GripEvidence.Basis"/>).</param>
/// <param name="Why">The same, in words.</param>
public sealed record TractionBound(string Source, double MeanDecelMps2, double Bound0To60S, double Bound0To100KmhS, string Basis, string Why)
{
    /// <summary>What the bound does not account for, for reports.</summary>
    public const string Caveats =
        "the bound assumes the car could accelerate as hard as it brakes; braking uses all four tyres and " +
        "aerodynamic drag helps it, so a two-wheel-drive car normally stays well short of it; downforce " +
        "changes grip with speed; thrust that does not come through the tyres is not bounded at all";
}
