using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Simulation.Box;

/// <summary>The box's storage: keeps every frame in memory.</summary>
internal sealed class MemoryLogSink : IByteSink
{
    private readonly MemoryStream stream = new();

    /// <summary>Frames written.</summary>
    internal long FrameCount { get; private set; }

    /// <inheritdoc/>
    public bool Write(byte[] buffer, int offset, int count)
    {
        stream.Write(buffer, offset, count);
        FrameCount++;
        return true;
    }

    /// <summary>A copy of the bytes written.</summary>
    internal byte[] ToArray() => stream.ToArray();
}
