namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>One figure timed from both records.</summary>
/// <param name="Figure">The figure's label (e.g. "0-60 mph", "1/4 mile", "1/4 mile trap").</param>
/// <param name="Convention">"standstill", "rollout", or "n/a" for figures no convention changes.</param>
/// <param name="Unit">"s" for times, "m/s" for speeds.</param>
/// <param name="Ours">Our value.</param>
/// <param name="OursSigma">Its 1-σ.</param>
/// <param name="Theirs">The other record's value, by our definitions.</param>
/// <param name="TheirsSigma">Its 1-σ, from what its sample rate and noise allow.</param>
public sealed record CrossCheckRow(string Figure, string Convention, string Unit, double Ours, double OursSigma, double Theirs, double TheirsSigma)
{
    /// <summary>Theirs − ours.</summary>
    public double Difference => Theirs - Ours;

    /// <summary>1-σ of the difference, taking the two records' errors as independent.</summary>
    public double CombinedSigma => Math.Sqrt((OursSigma * OursSigma) + (TheirsSigma * TheirsSigma));

    /// <summary>Whether the difference lies within ±2 combined σ (about 95 % for a normal error).</summary>
    public bool WithinUncertainty => Math.Abs(Difference) <= 2 * CombinedSigma;
}
