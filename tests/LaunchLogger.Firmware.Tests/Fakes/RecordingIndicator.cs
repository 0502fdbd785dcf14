using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A status indicator that remembers every phase it was asked to show.</summary>
public sealed class RecordingIndicator : IStatusIndicator
{
    public List<RunPhase> Shown { get; } = new();

    public void Show(RunPhase phase) => Shown.Add(phase);
}
