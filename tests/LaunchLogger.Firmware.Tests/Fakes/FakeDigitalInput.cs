using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A brake switch or mark button the test presses.</summary>
public sealed class FakeDigitalInput : IDigitalInput
{
    public bool Active { get; set; }

    public bool IsActive() => Active;
}
