using System.Device.Gpio;
using System.Device.Gpio.Drivers;
using System.Device.I2c;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.LinuxBoard.Timing;
using LaunchLogger.Firmware.LinuxBoard.Configuration;
using LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;
using LaunchLogger.Firmware.LinuxBoard.Inputs;
using LaunchLogger.Firmware.LinuxBoard.Sinks;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Sinks;

namespace LaunchLogger.Firmware.LinuxBoard;

/// <summary>Opens the real devices named in the settings file.</summary>
public static class LinuxHardware
{
    /// <summary>Observations the capture queue holds between two loop passes.</summary>
    public const int QueueCapacity = 4096;

    private const string Consumer = "launchlogger";

    /// <summary>Opens every device; on any failure closes what was opened and rethrows.</summary>
    /// <exception cref="IOException">A device cannot be opened; the message names it.</exception>
    public static BoardHardware Open(BoardSettings settings, HealthCounters health, TextWriter errors)
    {
        var parts = new List<IDisposable>();
        try
        {
            var counter = new MonotonicMicrosecondCounter();
            var queue = new EdgeObservationQueue(QueueCapacity, health);
            int[] lines = settings.Pulses.SecondLine.HasValue
                ? new[] { settings.Pulses.Line, settings.Pulses.SecondLine.Value }
                : new[] { settings.Pulses.Line };
            var reader = GpioLineEventReader.Open(
                settings.Pulses.Chip,
                lines,
                BoardSettingsFile.ParseEdges(settings.Pulses.Edges),
                BoardSettingsFile.ParseBias(settings.Pulses.Bias),
                settings.Pulses.KernelEventBuffer,
                Consumer);
            long requestedAt = new LaunchLogger.Firmware.Clock.MonotonicClock(counter, null).NowMicros();
            var tracker = new LineEdgeTracker(lines, counter, queue, health, requestedAt);
            parts.Add(new LineEventPump(reader, tracker, errors));

            Lis3dhFifoAccelerometer? accelerometer = null;
            if (settings.Accelerometer is { } a)
            {
                I2cDevice device = I2cDevice.Create(new I2cConnectionSettings(a.I2cBus, a.I2cAddress));
                try
                {
                    accelerometer = new Lis3dhFifoAccelerometer(device, a.RateHz, a.RangeG);
                }
                catch
                {
                    device.Dispose();
                    throw;
                }

                parts.Add(accelerometer);
            }

            IDigitalInput? brake = null;
            IDigitalInput? mark = null;
            IStatusIndicator? led = null;
            long debounceMicros = 0;
            if (settings.Inputs is { } i && (i.BrakePin.HasValue || i.MarkPin.HasValue || i.LedPin.HasValue))
            {
                GpioController controller = i.GpioChip.HasValue
                    ? new GpioController(new LibGpiodDriver(i.GpioChip.Value))
                    : new GpioController();
                parts.Add(controller);
                debounceMicros = i.DebounceMs * 1000L;
                if (i.BrakePin.HasValue)
                {
                    brake = new GpioDigitalInput(controller, i.BrakePin.Value, i.BrakeActiveLow, PinMode.Input);
                }

                if (i.MarkPin.HasValue)
                {
                    mark = new GpioDigitalInput(controller, i.MarkPin.Value, i.MarkActiveLow, PinMode.Input);
                }

                if (i.LedPin.HasValue)
                {
                    var statusLed = new GpioStatusLed(controller, i.LedPin.Value);
                    parts.Add(statusLed);
                    led = statusLed;
                }
            }

            var file = FileByteSink.CreateInFolder(settings.Log.Folder, DateTime.UtcNow, settings.Log.FlushIntervalMs, settings.Log.FsyncIntervalMs);
            parts.Add(file);
            IByteSink sink = file;
            SerialByteSink? serial = null;
            TeeByteSink? tee = null;
            if (settings.Serial is { } s)
            {
                serial = new SerialByteSink(s.Port, s.BaudRate, s.WriteTimeoutMs, errors: errors);
                parts.Add(serial);
                tee = new TeeByteSink(file, serial);
                sink = tee;
            }

            var hardware = new BoardHardware
            {
                Counter = counter,
                Pulses = queue,
                Accelerometer = accelerometer,
                AccelFifoDepth = Lis3dhFifoAccelerometer.FifoDepth,
                BrakeSwitch = brake,
                MarkButton = mark,
                SwitchHoldMicros = debounceMicros,
                Indicator = led,
                Sink = sink,
                Report = () => Report(file, serial, tee),
            };
            foreach (IDisposable part in parts)
            {
                hardware.Own(part);
            }

            return hardware;
        }
        catch
        {
            for (int k = parts.Count - 1; k >= 0; k--)
            {
                parts[k].Dispose();
            }

            throw;
        }
    }

    private static IEnumerable<string> Report(FileByteSink file, SerialByteSink? serial, TeeByteSink? tee)
    {
        yield return "log file: " + file.Path + " (" + file.BytesWritten + " bytes, " + file.WriteFailures + " write failures)";
        if (serial != null && tee != null)
        {
            yield return "serial stream: " + serial.BytesSent + " bytes sent, " + tee.SecondaryRefusals + " frames refused (buffer full), " + serial.BytesDropped + " bytes dropped (timeouts)";
        }
    }
}
