namespace LaunchLogger.Decoding.Runs;

/// <summary>One pulse observation on the input's time axis: the cumulative count of a channel
/// (counted from the run's origin) reached <see cref="Count"/> at some time t with
/// <see cref="LoS"/> &lt; t ≤ <see cref="HiS"/>.</summary>
/// <param name="Count">Pulses since the run's origin (≥ 1 for the first pulse of a run).</param>
/// <param name="LoS">Bracket start, seconds (exclusive).</param>
/// <param name="HiS">Bracket end, seconds (inclusive). Equal to <paramref name="LoS"/> for a
/// plain-text edge time that carries no bracket.</param>
public readonly record struct PulseRecord(long Count, double LoS, double HiS)
{
    /// <summary>Bracket midpoint, seconds.</summary>
    public double MidS => 0.5 * (LoS + HiS);

    /// <summary>Bracket width, seconds.</summary>
    public double WidthS => HiS - LoS;
}
