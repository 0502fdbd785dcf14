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
    private readonly RecordChunks<uint> packed;
    private readonly long baseCount;
    private readonly long baseMicros;

    /// <param name="packed">Count, bracket start and bracket end of each observation, a record each.</param>
    /// <param name="baseCount">The count the stored counts are above.</param>
    /// <param name="baseMicros">The time, µs, the stored bracket ends are above.</param>
    public PackedPulses(RecordChunks<uint> packed, long baseCount, long baseMicros)
    {
        this.packed = packed;
        Count = packed.Count;
        this.baseCount = baseCount;
        this.baseMicros = baseMicros;
    }

    /// <summary>Elements of a record: count, bracket start, bracket end.</summary>
    public const int RecordLength = 3;

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

            ReadOnlySpan<uint> record = packed.Record(index);
            var read = new PulseRecord(baseCount + record[0], LogUnits.Seconds(baseMicros + record[1]), LogUnits.Seconds(baseMicros + record[2]));

            // The chunks stay this run's until the record is read (RecordChunks).
            GC.KeepAlive(packed);
            return read;
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
