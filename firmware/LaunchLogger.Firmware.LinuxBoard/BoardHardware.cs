using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard;

/// <summary>Everything the capture loop talks to, behind the core's interfaces, plus whatever
/// must be closed at the end. <see cref="LinuxHardware.Open"/> builds the real one; tests build
/// one from fakes.</summary>
public sealed class BoardHardware : IDisposable
{
    private readonly List<IDisposable> owned = new();

    /// <summary>The microsecond counter the core's clock extends.</summary>
    public required IMicrosecondCounter Counter { get; init; }

    /// <summary>Pulse observations.</summary>
    public required IPulseSource Pulses { get; init; }

    /// <summary>The accelerometer, or null.</summary>
    public IAccelerometer? Accelerometer { get; init; }

    /// <summary>Samples the accelerometer's FIFO holds (the most per burst).</summary>
    public int AccelFifoDepth { get; init; } = 32;

    /// <summary>The brake switch, or null.</summary>
    public IDigitalInput? BrakeSwitch { get; init; }

    /// <summary>The mark button, or null.</summary>
    public IDigitalInput? MarkButton { get; init; }

    /// <summary>How long a new level of the brake switch or mark button must hold (µs); the
    /// core's loop debounces the raw inputs (<see cref="CaptureLoop.SwitchHoldMicros"/>).</summary>
    public long SwitchHoldMicros { get; init; }

    /// <summary>The status LED, or null.</summary>
    public IStatusIndicator? Indicator { get; init; }

    /// <summary>Where log frames go.</summary>
    public required IByteSink Sink { get; init; }

    /// <summary>Lines for the end-of-run report (bytes written, frames refused by the stream…).</summary>
    public Func<IEnumerable<string>>? Report { get; init; }

    /// <summary>Adds something to close when the hardware is disposed (last added, first closed).</summary>
    public T Own<T>(T part)
        where T : IDisposable
    {
        owned.Add(part);
        return part;
    }

    /// <summary>Closes everything owned, newest first.</summary>
    public void Dispose()
    {
        for (int i = owned.Count - 1; i >= 0; i--)
        {
            owned[i].Dispose();
        }

        owned.Clear();
    }
}
