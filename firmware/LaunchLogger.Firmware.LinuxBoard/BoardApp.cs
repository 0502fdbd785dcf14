using LaunchLogger.Firmware.LinuxBoard.Configuration;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard;

/// <summary>The program's body: settings in, hardware opened, loop run until stopped, report out.
/// Program.cs passes the real hardware; tests pass fakes.</summary>
public static class BoardApp
{
    /// <summary>Exit code: the loop ran and stopped when asked.</summary>
    public const int ExitOk = 0;

    /// <summary>Exit code: the settings file is unusable.</summary>
    public const int ExitBadSettings = 2;

    /// <summary>Exit code: a device could not be opened.</summary>
    public const int ExitHardware = 3;

    /// <summary>Runs the logger until <paramref name="stop"/> is cancelled.</summary>
    /// <param name="settings">The checked settings file.</param>
    /// <param name="openHardware">Opens the hardware, given the health counters it must share.</param>
    /// <param name="stop">Cancelled by Ctrl+C or SIGTERM.</param>
    /// <param name="output">Where the start and end reports go.</param>
    /// <param name="betweenSteps">Passed to <see cref="BoardRunner.Run"/>.</param>
    /// <returns>One of the exit codes above.</returns>
    public static int Run(BoardSettings settings, Func<HealthCounters, BoardHardware> openHardware, CancellationToken stop, TextWriter output, Action? betweenSteps = null)
    {
        var health = new HealthCounters();
        BoardHardware hardware;
        try
        {
            hardware = openHardware(health);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or PlatformNotSupportedException or DllNotFoundException or ArgumentException)
        {
            output.WriteLine("error: " + e.Message);
            return ExitHardware;
        }

        using (hardware)
        {
            LoggerSettings logger = BoardSettingsFile.ToLoggerSettings(settings);
            if (hardware.Accelerometer != null)
            {
                // What the chip was actually set to, not what the file asked for.
                logger.AccelOutputDataRateMilliHz = hardware.Accelerometer.OutputDataRateMilliHz;
                logger.AccelFullScaleMilliG = hardware.Accelerometer.FullScaleMilliG;
            }

            logger.AccelPresent = hardware.Accelerometer != null;
            string? problem = logger.Validate();
            if (problem != null)
            {
                output.WriteLine("error: " + problem);
                return ExitBadSettings;
            }

            var runner = new BoardRunner(logger, health, hardware);
            output.WriteLine("logging: " + logger.ChannelCount + " pulse channel(s), " + logger.PulsesPerRevolution + " pulses/rev, "
                + (hardware.Accelerometer == null ? "no accelerometer" : "accelerometer at " + (logger.AccelOutputDataRateMilliHz / 1000) + " Hz")
                + "; Ctrl+C stops");
            runner.Run(stop, betweenSteps);
            output.WriteLine("stopped after " + runner.Recorder.RunNumber + " run(s), " + runner.Recorder.FramesWritten + " frames");
            output.WriteLine("health: " + health.PulseObservationsDropped + " pulse observations dropped, "
                + health.AccelReadFailures + " accelerometer read failures, " + health.AccelFifoOverflows + " FIFO overflows, "
                + health.FramesRefused + " frames refused");
            if (hardware.Report != null)
            {
                foreach (string line in hardware.Report())
                {
                    output.WriteLine(line);
                }
            }
        }

        return ExitOk;
    }
}
