using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>A microsecond counter the test moves by hand.</summary>
internal sealed class ManualMicrosecondCounter : IMicrosecondCounter
{
    public long NowMicros { get; set; }

    public uint ReadMicros32() => unchecked((uint)NowMicros);
}
