using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard;

/// <summary>Runs the core's <see cref="CaptureLoop"/> on the board's hardware until asked to
/// stop, then closes any open run with <see cref="RunRecorder.Shutdown"/>.</summary>
/// <remarks>On Linux the kernel timestamps the edges and the accelerometer's FIFO keeps its
/// samples, so the loop's own timing only decides how soon frames are written: it sleeps a
/// millisecond between passes instead of spinning a core.</remarks>
public sealed class BoardRunner
{
    private readonly MonotonicClock clock;
    private readonly CaptureLoop loop;

    /// <summary>Wires the core to the hardware.</summary>
    /// <param name="settings">The core's settings (checked by the recorder).</param>
    /// <param name="health">The counters shared with the hardware (capture queue, line tracker).</param>
    /// <param name="hardware">The board's parts.</param>
    /// <exception cref="ArgumentException">The settings are unusable.</exception>
    public BoardRunner(LoggerSettings settings, HealthCounters health, BoardHardware hardware)
    {
        ArgumentNullException.ThrowIfNull(settings);
        ArgumentNullException.ThrowIfNull(hardware);
        clock = new MonotonicClock(hardware.Counter, health);
        Recorder = new RunRecorder(settings, hardware.Sink, health);

        // Counts from the line tracker start at 0 when the lines are requested, so the very
        // first edge is already a change.
        for (int c = 0; c < settings.ChannelCount; c++)
        {
            Recorder.SetCounterOrigin(c, 0);
        }

        int fifoDepth = Math.Max(1, hardware.AccelFifoDepth);
        int accelIntervalMicros = 0;
        if (hardware.Accelerometer != null)
        {
            // Read when the FIFO is about half full: never overflows, and bursts stay short.
            accelIntervalMicros = (int)(fifoDepth * 500_000_000L / hardware.Accelerometer.OutputDataRateMilliHz);
        }

        AccelIntervalMicros = accelIntervalMicros;
        loop = new CaptureLoop(
            clock,
            hardware.Pulses,
            hardware.Accelerometer,
            hardware.BrakeSwitch,
            hardware.MarkButton,
            hardware.Indicator,
            Recorder,
            fifoDepth,
            accelIntervalMicros)
        {
            SwitchHoldMicros = hardware.SwitchHoldMicros,
        };
    }

    /// <summary>The run recorder being fed.</summary>
    public RunRecorder Recorder { get; }

    /// <summary>How often the accelerometer's FIFO is read (µs).</summary>
    public int AccelIntervalMicros { get; }

    /// <summary>Loop passes made.</summary>
    public long Steps { get; private set; }

    /// <summary>Runs until <paramref name="stop"/> is cancelled, then shuts the recorder down.</summary>
    /// <param name="stop">Cancelled by Ctrl+C or SIGTERM.</param>
    /// <param name="betweenSteps">What to do between passes; null sleeps one millisecond.</param>
    public void Run(CancellationToken stop, Action? betweenSteps = null)
    {
        while (!stop.IsCancellationRequested)
        {
            loop.Step();
            Steps++;
            if (betweenSteps != null)
            {
                betweenSteps();
            }
            else
            {
                Thread.Sleep(1);
            }
        }

        // One last pass takes what the queue still holds into the open run.
        loop.Step();
        Recorder.Shutdown(clock.NowMicros());
    }
}
