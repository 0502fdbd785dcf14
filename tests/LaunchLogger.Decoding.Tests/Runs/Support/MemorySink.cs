using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Decoding.Tests.Runs.Support;

/// <summary>Keeps every frame the firmware writes, and where each one starts.</summary>
internal sealed class MemorySink : IByteSink
{
    private readonly MemoryStream stream = new();

    public List<(int Offset, int Length)> Frames { get; } = [];

    public bool Write(byte[] buffer, int offset, int count)
    {
        Frames.Add(((int)stream.Length, count));
        stream.Write(buffer, offset, count);
        return true;
    }

    public byte[] ToArray() => stream.ToArray();
}
