using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A 32-bit microsecond counter driven by a 64-bit true time that the test sets;
/// optionally advances by a fixed step after every read, like a real counter ticking while
/// the code runs.</summary>
public sealed class FakeMicrosecondCounter : IMicrosecondCounter
{
    public FakeMicrosecondCounter(ulong startMicros = 0)
    {
        TrueMicros = startMicros;
    }

    /// <summary>The true time in µs since the counter's zero (never wraps).</summary>
    public ulong TrueMicros { get; set; }

    /// <summary>Microseconds added after each read.</summary>
    public uint StepPerRead { get; set; }

    /// <summary>Reads so far.</summary>
    public int Reads { get; private set; }

    public uint ReadMicros32()
    {
        uint raw = unchecked((uint)TrueMicros);
        TrueMicros += StepPerRead;
        Reads++;
        return raw;
    }
}
