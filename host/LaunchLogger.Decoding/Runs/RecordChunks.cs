using System.Numerics;
using System.Runtime.CompilerServices;

namespace LaunchLogger.Decoding.Runs;

/// <summary>A run's fixed-size records (packed pulse observations, accelerometer samples as
/// written) in chunks of <see cref="ChunkBytes"/>; a large run's chunks are reused by later runs
/// once it is let go.</summary>
/// <remarks>
/// <para>Why: a run's packed arrays are large objects (a 38-s 1 kHz run holds 0.3 MB of pulses
/// and 0.2 MB of samples), and the collector frees large objects only in full collections;
/// under <c>System.GC.ConserveMemory</c> each of those compacts the large-object heap and gives
/// its pages back, to be faulted in again for the next runs. When runs are read and let go one
/// after another (<c>report</c>), that churn cost as much as reading the runs. So a run at least
/// <see cref="LargeObjectBytes"/> long takes whole chunks from a pool, and gives them back when
/// the collector finds the run unreachable (a finalizer: a run has no owner that could say
/// when it is done with); the next runs take them from there, already in memory, and the
/// large-object heap stops growing. A run that is kept keeps its chunks, as it kept its arrays.</para>
/// <para>Records past the last whole chunk that take less than <see cref="LargeObjectBytes"/>
/// have an array of exactly their size, which dies young with the run (and so does a small run's
/// only array), so a kept run holds at most that much more than its records.</para>
/// <para>The pool keeps at most <see cref="MaxPooledBytes"/> of each element type; a chunk given
/// back beyond that goes to the collector.</para>
/// <para>Readers hold spans into the chunks: whoever reads must keep this object reachable until
/// the last read (<see cref="GC.KeepAlive"/>), or its chunks could go back to the pool, and to
/// another run, under a read.</para>
/// </remarks>
/// <typeparam name="T">The element type (no references: chunks are not cleared).</typeparam>
internal sealed class RecordChunks<T>
    where T : unmanaged
{
    /// <summary>Bytes of each chunk: 3 × 2^15, a whole power of two of records of 3, 6 or 12
    /// bytes, and above <see cref="LargeObjectBytes"/>, so a chunk lives on the large-object
    /// heap (never copied by the collector) and is given back whole.</summary>
    public const int ChunkBytes = 98_304;

    /// <summary>The collector's large-object threshold, bytes (its default).</summary>
    public const int LargeObjectBytes = 85_000;

    /// <summary>The most bytes the pool keeps for later runs, per element type.</summary>
    public const long MaxPooledBytes = 64L << 20;

    private static readonly Stack<T[]> Free = new();
    private static readonly int ChunkLength = ChunkBytes / Unsafe.SizeOf<T>();
    private static readonly int MaxFree = (int)(MaxPooledBytes / ChunkBytes);

    private T[][] chunks;
    private readonly bool pooled;
    private readonly int recordLength;
    private readonly int shift;
    private readonly int mask;

    /// <summary>Room for <paramref name="records"/> records of <paramref name="recordLength"/>
    /// elements each, contents undefined.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A record's bytes do not divide a chunk
    /// into a power of two of records, or <paramref name="records"/> is negative.</exception>
    public RecordChunks(int recordLength, int records)
    {
        int perChunk = ChunkLength / Math.Max(recordLength, 1);
        if (recordLength < 1 || perChunk * recordLength != ChunkLength || !BitOperations.IsPow2(perChunk))
        {
            throw new ArgumentOutOfRangeException(nameof(recordLength), "a chunk must hold a power of two of whole records");
        }

        ArgumentOutOfRangeException.ThrowIfNegative(records);
        this.recordLength = recordLength;
        shift = BitOperations.Log2((uint)perChunk);
        mask = perChunk - 1;
        Count = records;
        int full = records >> shift;
        int tail = (records & mask) * recordLength;
        if (tail * Unsafe.SizeOf<T>() >= LargeObjectBytes)
        {
            full++;
            tail = 0;
        }

        chunks = new T[full + (tail > 0 || full == 0 ? 1 : 0)][];
        for (int c = 0; c < full; c++)
        {
            chunks[c] = Rent();
        }

        if (full < chunks.Length)
        {
            chunks[^1] = GC.AllocateUninitializedArray<T>(tail);
        }

        pooled = full > 0;
        if (!pooled)
        {
            GC.SuppressFinalize(this);
        }
    }

    /// <summary>Gives a let-go run's chunks back to the pool.</summary>
    ~RecordChunks() => Release();

    /// <summary>Records held.</summary>
    public int Count { get; private set; }

    /// <summary>Records per chunk (a power of two).</summary>
    public int RecordsPerChunk => mask + 1;

    /// <summary>Chunks held.</summary>
    public int Chunks => chunks.Length;

    /// <summary>Chunks in the pool now, of this element type.</summary>
    public static int PooledChunks
    {
        get
        {
            lock (Free)
            {
                return Free.Count;
            }
        }
    }

    /// <summary>Record <paramref name="index"/>'s elements (no range check beyond the chunk's).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public Span<T> Record(int index) => chunks[index >> shift].AsSpan((index & mask) * recordLength, recordLength);

    /// <summary>The records of chunk <paramref name="chunk"/> that lie below <see cref="Count"/>.</summary>
    public Span<T> Chunk(int chunk)
    {
        int first = chunk << shift;
        int records = Math.Min(Count - first, RecordsPerChunk);
        return chunks[chunk].AsSpan(0, records * recordLength);
    }

    /// <summary>Writes whole records from <paramref name="firstRecord"/> on, across chunks.</summary>
    public void Write(int firstRecord, ReadOnlySpan<T> values)
    {
        while (!values.IsEmpty)
        {
            Span<T> into = chunks[firstRecord >> shift].AsSpan((firstRecord & mask) * recordLength);
            int length = Math.Min(into.Length, values.Length);
            values[..length].CopyTo(into);
            values = values[length..];
            firstRecord += length / recordLength;
        }
    }

    /// <summary>Keeps only the first <paramref name="records"/> records, giving back the chunks
    /// past them (a run that dropped some of what it read).</summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="records"/> is negative or more than held.</exception>
    public void Shrink(int records)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(records);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(records, Count);
        Count = records;
        int needed = Math.Max(1, (int)((records + (long)mask) >> shift));
        if (!pooled || needed == chunks.Length)
        {
            return;
        }

        Give(chunks.AsSpan(needed));
        chunks = chunks[..needed];
    }

    /// <summary>Gives the chunks back now, for records that will never be read (the run's
    /// packed form was given up); nothing may be read afterwards.</summary>
    public void Discard()
    {
        Release();
        GC.SuppressFinalize(this);
    }

    private static T[] Rent()
    {
        lock (Free)
        {
            if (Free.TryPop(out T[]? chunk))
            {
                return chunk;
            }
        }

        return GC.AllocateUninitializedArray<T>(ChunkLength);
    }

    private static void Give(ReadOnlySpan<T[]> given)
    {
        lock (Free)
        {
            foreach (T[] chunk in given)
            {
                if (chunk.Length == ChunkLength && Free.Count < MaxFree)
                {
                    Free.Push(chunk);
                }
            }
        }
    }

    private void Release()
    {
        if (pooled)
        {
            Give(chunks);
        }
    }
}
