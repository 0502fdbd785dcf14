using System.Buffers.Binary;

namespace LaunchLogger.Decoding.Reading;

/// <summary>The body of an acceleration frame (LOG-FORMAT.md, frame 0x03): one burst, or part
/// of one, of x, y, z samples in milli-g, read without copying.</summary>
public readonly ref struct AccelerationBody
{
    /// <summary>The bytes of one sample: x, y, z as i16 LE.</summary>
    public const int BytesPerSample = 6;

    private readonly ReadOnlySpan<byte> samples;

    internal AccelerationBody(long readMicros, long firstIndex, ReadOnlySpan<byte> samples)
    {
        ReadMicros = readMicros;
        FirstIndex = firstIndex;
        this.samples = samples;
    }

    /// <summary>When the box read the burst, µs.</summary>
    public long ReadMicros { get; }

    /// <summary>The sensor's index of the first sample in this frame.</summary>
    public long FirstIndex { get; }

    /// <summary>Samples in this frame (≥ 1).</summary>
    public int Count => samples.Length / BytesPerSample;

    /// <summary>The index of the last sample in this frame.</summary>
    public long LastIndex => FirstIndex + Count - 1;

    /// <summary>The samples as written: x, y, z as i16 LE, <see cref="BytesPerSample"/> bytes each.</summary>
    internal ReadOnlySpan<byte> Samples => samples;

    /// <summary>Sample <paramref name="i"/>'s value on sensor axis <paramref name="axis"/> (0 = x, 1 = y, 2 = z), milli-g.</summary>
    public short MilliG(int i, int axis) => BinaryPrimitives.ReadInt16LittleEndian(samples.Slice((i * BytesPerSample) + (axis * 2), 2));
}
