namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>How the other instrument's clock lines up with ours.</summary>
/// <param name="OffsetS">Add to the other instrument's times to get ours, s.</param>
/// <param name="OffsetSigmaS">1-σ of <paramref name="OffsetS"/>, s.</param>
/// <param name="ResidualRmsMps">RMS of our speed minus theirs over the matched samples, m/s.</param>
/// <param name="SamplesUsed">Their samples inside our run that the fit used.</param>
public sealed record TraceAlignment(double OffsetS, double OffsetSigmaS, double ResidualRmsMps, int SamplesUsed)
{
    /// <summary>Their speeds over ours, fitted with the offset (1 when they agree).</summary>
    public double SpeedScale { get; init; } = 1;
}
