using System.Buffers;
using System.Runtime.CompilerServices;

namespace LaunchLogger.Decoding.Reading;

/// <summary>A growable array of plain values rented from <see cref="ArrayPool{T}.Shared"/>:
/// the collection step of reading a log, reused from run to run so that a long log grows it
/// once instead of once per run.</summary>
/// <remarks>Only for types without references (the pool does not clear what it gets back).
/// <see cref="Dispose"/> gives the array back; a buffer never disposed is simply collected.
/// Its arrays come from <see cref="ScratchArrays"/>: a long run's buffers (and the smaller ones
/// they grew from) are not kept in the pool after the run.</remarks>
internal sealed class PooledBuffer<T> : IDisposable
    where T : unmanaged
{
    private T[] items;

    public PooledBuffer(int initialCapacity)
    {
        items = Rent(Math.Max(initialCapacity, 16));
    }

    /// <summary>Values held.</summary>
    public int Count { get; private set; }

    /// <summary>The values held, in the order they were added; valid until the next add.</summary>
    public Span<T> Span => items.AsSpan(0, Count);

    /// <summary>Value <paramref name="index"/>, by reference; the index is checked against the
    /// array's length, not against <see cref="Count"/>.</summary>
    public ref T this[int index] => ref items[index];

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Add(in T item)
    {
        int count = Count;
        T[] array = items;
        if ((uint)count < (uint)array.Length)
        {
            array[count] = item;
            Count = count + 1;
            return;
        }

        AddWithGrowth(item);
    }

    /// <summary>Makes room for <paramref name="count"/> more values and returns them to be filled.</summary>
    public Span<T> Append(int count)
    {
        EnsureCapacity(Count + count);
        Span<T> room = items.AsSpan(Count, count);
        Count += count;
        return room;
    }

    /// <summary>Appends <paramref name="values"/> with one copy.</summary>
    public void AddRange(ReadOnlySpan<T> values) => values.CopyTo(Append(values.Length));

    /// <summary>Drops the values from <paramref name="count"/> on.</summary>
    public void Truncate(int count) => Count = Math.Clamp(count, 0, Count);

    /// <summary>Empties the buffer, keeping its array.</summary>
    public void Clear() => Count = 0;

    /// <summary>Empties the buffer and lets go of its array if it is too large to pool (a long
    /// run's), so that it is not held while the next, likely shorter, run is read.</summary>
    public void ClearAndShrink()
    {
        Count = 0;
        if ((long)items.Length * Unsafe.SizeOf<T>() > ScratchArrays.MaxPooledBytes)
        {
            items = Rent(16);
        }
    }

    /// <summary>Gives the array back to the pool; the buffer must not be used afterwards.</summary>
    public void Dispose()
    {
        T[] array = items;
        items = [];
        Count = 0;
        GiveBack(array);
    }

    private static T[] Rent(int size) => ScratchArrays.Rent<T>(size);

    private static void GiveBack(T[] array) => ScratchArrays.Return(array);

    [MethodImpl(MethodImplOptions.NoInlining)]
    private void AddWithGrowth(T item)
    {
        EnsureCapacity(Count + 1);
        items[Count++] = item;
    }

    private void EnsureCapacity(int needed)
    {
        if (needed <= items.Length)
        {
            return;
        }

        int size = (int)Math.Min(Math.Max((long)needed, 2L * items.Length), Array.MaxLength);
        if (size < needed)
        {
            throw new OutOfMemoryException("a run holds more values than an array can");
        }

        T[] larger = Rent(size);
        items.AsSpan(0, Count).CopyTo(larger);
        T[] old = items;
        items = larger;
        GiveBack(old);
    }
}
