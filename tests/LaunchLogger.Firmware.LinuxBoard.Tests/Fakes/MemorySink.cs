using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>Keeps every accepted byte; refuses when told to.</summary>
internal sealed class MemorySink : IByteSink
{
    private readonly MemoryStream bytes = new();

    public bool Refuse { get; set; }

    public int Calls { get; private set; }

    public byte[] ToArray() => bytes.ToArray();

    public bool Write(byte[] buffer, int offset, int count)
    {
        Calls++;
        if (Refuse)
        {
            return false;
        }

        bytes.Write(buffer, offset, count);
        return true;
    }
}
