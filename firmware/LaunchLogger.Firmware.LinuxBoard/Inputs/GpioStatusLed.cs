using System.Device.Gpio;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Inputs;

/// <summary>The status LED on a GPIO pin, blinking the <see cref="PhaseBlinkPattern"/> of the current
/// phase from a timer so the capture loop never waits on it.</summary>
public sealed class GpioStatusLed : IStatusIndicator, IDisposable
{
    private const int TickMs = 50;
    private readonly GpioController controller;
    private readonly int pin;
    private readonly Timer timer;
    private readonly object sync = new();
    private RunPhase phase;
    private long phaseStartMs;
    private bool lit;
    private bool disposed;

    /// <summary>Opens <paramref name="pin"/> as an output, LED off, and starts blinking Idle.</summary>
    public GpioStatusLed(GpioController controller, int pin)
    {
        this.controller = controller ?? throw new ArgumentNullException(nameof(controller));
        this.pin = pin;
        controller.OpenPin(pin, PinMode.Output, PinValue.Low);
        phase = RunPhase.Idle;
        phaseStartMs = Environment.TickCount64;
        timer = new Timer(_ => Refresh(), null, 0, TickMs);
    }

    /// <inheritdoc/>
    public void Show(RunPhase phase)
    {
        lock (sync)
        {
            this.phase = phase;
            phaseStartMs = Environment.TickCount64;
        }

        Refresh();
    }

    /// <summary>Stops blinking and turns the LED off.</summary>
    public void Dispose()
    {
        lock (sync)
        {
            if (disposed)
            {
                return;
            }

            disposed = true;
        }

        using (var stopped = new ManualResetEvent(false))
        {
            timer.Dispose(stopped);
            stopped.WaitOne();
        }

        controller.Write(pin, PinValue.Low);
    }

    private void Refresh()
    {
        lock (sync)
        {
            if (disposed)
            {
                return;
            }

            bool on = PhaseBlinkPattern.IsOn(phase, Environment.TickCount64 - phaseStartMs);
            if (on != lit)
            {
                controller.Write(pin, on ? PinValue.High : PinValue.Low);
                lit = on;
            }
        }
    }
}
