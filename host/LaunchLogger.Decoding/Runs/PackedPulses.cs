using System.Collections;

namespace LaunchLogger.Decoding.Runs;

/// <summary>A log's pulse observations of one channel in 12 bytes each instead of a
/// <see cref="PulseRecord"/>'s 24: the count above the first one kept and the bracket's ends in
/// µs above the run's earliest time, as unsigned 32-bit integers; each record is built when it
/// is read, with the same doubles the reader made before (µs ÷ 10^6, <see cref="LogUnits.Seconds"/>).</summary>
/// <remarks>Used when every value fits (the run's time bounds span 3,660 s, below 2^32 µs;
/// counts need only stay within 2^32 of the first); otherwise the reader keeps an array.</remarks>
internal sealed class PackedPulses : IReadOnlyList<PulseRecord>
{
    private readonly uint[] packed;
    private readonly long baseCount;
    private readonly long baseMicros;

    /// <param name="packed">Count, bracket start and bracket end of each observation, in turn.</param>
    /// <param name="count">Observations held.</param>
    /// <param name="baseCount">The count the stored counts are above.</param>
    /// <param name="baseMicros">The time, µs, the stored bracket ends are above.</param>
    public PackedPulses(uint[] packed, int count, long baseCount, long baseMicros)
    {
        this.packed = packed;
        Count = count;
        this.baseCount = baseCount;
        this.baseMicros = baseMicros;
    }

    /// <summary>Observations held.</summary>
    public int Count { get; }

    /// <summary>Observation <paramref name="index"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="index"/> is outside the list.</exception>
    public PulseRecord this[int index]
    {
        get
        {
            if ((uint)index >= (uint)Count)
            {
                throw new ArgumentOutOfRangeException(nameof(index));
            }

            int at = 3 * index;
            return new PulseRecord(baseCount + packed[at], LogUnits.Seconds(baseMicros + packed[at + 1]), LogUnits.Seconds(baseMicros + packed[at + 2]));
        }
    }

    public IEnumerator<PulseRecord> GetEnumerator()
    {
        for (int i = 0; i < Count; i++)
        {
            yield return this[i];
        }
    }

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();
}
