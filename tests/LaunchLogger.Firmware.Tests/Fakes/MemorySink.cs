using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A byte sink that keeps a copy of everything written (the writer reuses its buffer),
/// checks that each write is one whole stuffed frame, and can refuse writes on request.</summary>
public sealed class MemorySink : IByteSink
{
    private readonly List<byte> bytes = new();

    /// <summary>While true every write is refused.</summary>
    public bool RefuseAll { get; set; }

    /// <summary>Writes left to refuse before accepting again.</summary>
    public int RefuseNext { get; set; }

    public int Writes { get; private set; }

    public int Refused { get; private set; }

    public byte[] Bytes => bytes.ToArray();

    /// <summary>Decodes everything accepted so far.</summary>
    public IReadOnlyList<Frame> Frames => FrameLog.Decode(Bytes);

    public void Clear() => bytes.Clear();

    public bool Write(byte[] buffer, int offset, int count)
    {
        Writes++;
        // A lone delimiter (count 1) is the empty frame written at power-up.
        if (count < 1 || buffer[offset + count - 1] != 0 || Array.IndexOf(buffer, (byte)0, offset, count - 1) >= 0)
        {
            throw new InvalidOperationException("a write must be one stuffed frame (or a lone delimiter) ending in its only zero byte");
        }

        if (RefuseAll || RefuseNext > 0)
        {
            if (RefuseNext > 0)
            {
                RefuseNext--;
            }

            Refused++;
            return false;
        }

        for (int i = 0; i < count; i++)
        {
            bytes.Add(buffer[offset + i]);
        }

        return true;
    }
}
