using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Cli.Core;

/// <summary>Keeps every frame the core writes in memory, or only counts bytes when
/// <see cref="KeepBytes"/> is false (for benchmarks that must not allocate).</summary>
public sealed class MemoryByteSink : IByteSink
{
    private readonly MemoryStream stream = new();

    /// <summary>True to keep the bytes, false to count them only.</summary>
    public bool KeepBytes { get; init; } = true;

    /// <summary>Bytes handed over so far.</summary>
    public long ByteCount { get; private set; }

    /// <summary>Frames handed over so far.</summary>
    public long FrameCount { get; private set; }

    /// <inheritdoc/>
    public bool Write(byte[] buffer, int offset, int count)
    {
        if (KeepBytes)
        {
            stream.Write(buffer, offset, count);
        }

        ByteCount += count;
        FrameCount++;
        return true;
    }

    /// <summary>A copy of the bytes kept.</summary>
    public byte[] ToArray() => stream.ToArray();
}
