using System.Buffers.Binary;
using System.Runtime.CompilerServices;

namespace LaunchLogger.Decoding.Reading;

/// <summary>Reads the fields of one frame body (LOG-FORMAT.md, section 2). A read that runs
/// past the end or meets an out-of-range value sets <see cref="Failed"/> and returns zero;
/// parsers check it once at the end instead of after every field.</summary>
internal ref struct BodyReader
{
    /// <summary>The largest value a field may take. Keeping values below 2^62 means the sum or
    /// difference of any two fields cannot overflow a 64-bit integer (about 146 000 years in µs).</summary>
    public const long MaxFieldValue = (1L << 62) - 1;

    private readonly ReadOnlySpan<byte> data;
    private int position;

    public BodyReader(ReadOnlySpan<byte> data)
    {
        this.data = data;
        position = 0;
        Failed = false;
    }

    /// <summary>True once any read failed.</summary>
    public bool Failed { get; private set; }

    /// <summary>Bytes not read yet.</summary>
    public readonly int Remaining => data.Length - position;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public byte ReadByte()
    {
        if (position >= data.Length)
        {
            return Fail<byte>();
        }

        return data[position++];
    }

    public short ReadInt16()
    {
        if (data.Length - position < 2)
        {
            return Fail<short>();
        }

        short value = BinaryPrimitives.ReadInt16LittleEndian(data.Slice(position, 2));
        position += 2;
        return value;
    }

    /// <summary>Reads an unsigned LEB128 varint of at most 10 bytes, at most <see cref="MaxFieldValue"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public long ReadVarint()
    {
        ulong value = ReadRawVarint();
        if (value > MaxFieldValue)
        {
            return Fail<long>();
        }

        return (long)value;
    }

    /// <summary>Reads a varint that must lie in [<paramref name="min"/>, <paramref name="max"/>].</summary>
    public int ReadVarint(int min, int max)
    {
        long value = ReadVarint();
        if (value < min || value > max)
        {
            return Fail<int>();
        }

        return (int)value;
    }

    /// <summary>Reads a zig-zag signed varint of magnitude at most <see cref="MaxFieldValue"/> / 2.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public long ReadSignedVarint()
    {
        ulong raw = ReadRawVarint();
        if (raw > MaxFieldValue)
        {
            return Fail<long>();
        }

        return (long)(raw >> 1) ^ -(long)(raw & 1);
    }

    /// <summary>Takes the next <paramref name="count"/> bytes as they are.</summary>
    public ReadOnlySpan<byte> ReadBytes(int count)
    {
        if (count < 0 || data.Length - position < count)
        {
            Failed = true;
            return default;
        }

        ReadOnlySpan<byte> bytes = data.Slice(position, count);
        position += count;
        return bytes;
    }

    /// <summary>Marks the body as unreadable (a field's value is impossible).</summary>
    public void Reject() => Failed = true;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private ulong ReadRawVarint()
    {
        // One- and two-byte varints (nearly every delta and width) without the loop.
        ReadOnlySpan<byte> span = data;
        int at = position;
        if ((uint)at < (uint)span.Length)
        {
            uint first = span[at];
            if (first < 0x80)
            {
                position = at + 1;
                return first;
            }

            if ((uint)(at + 1) < (uint)span.Length)
            {
                uint second = span[at + 1];
                if (second < 0x80)
                {
                    position = at + 2;
                    return (first & 0x7F) | (second << 7);
                }
            }
        }

        return ReadRawVarintLong();
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private ulong ReadRawVarintLong()
    {
        ulong value = 0;
        int shift = 0;
        while (position < data.Length && shift < 64)
        {
            byte b = data[position++];
            if (shift == 63 && b > 1)
            {
                break;
            }

            value |= (ulong)(b & 0x7F) << shift;
            if ((b & 0x80) == 0)
            {
                return value;
            }

            shift += 7;
        }

        return Fail<ulong>();
    }

    private T Fail<T>()
        where T : struct
    {
        Failed = true;
        position = data.Length;
        return default;
    }
}
