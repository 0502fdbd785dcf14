using LaunchLogger.Esp32;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Configuration;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Esp32;

/// <summary>The ESP32's compiled-in settings (firmware/esp32/BoxSettings.cs, compiled here from
/// that folder): the still block as the Linux board's settings file takes it — the same meaning,
/// limits and default, checked by the same code — and written in each run's configuration.</summary>
public class Esp32BoxSettingsTests
{
    private const string Minimal = """{ "car": { "pulses_per_revolution": 48, "circumference_millimetres": 1960 }, "pulses": { "line": 17 }, "accelerometer": { ACCEL }, "log": { "folder": "/tmp" } }""";

    [Fact]
    public void The_default_still_block_is_the_linux_boards_and_the_cores()
    {
        LoggerSettings esp32 = BoxSettings.Create(new Lis3dhAt400Hz());
        LoggerSettings linux = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(Minimal.Replace("ACCEL", ""), "board.json"));

        Assert.Equal(50, BoxSettings.StillBlockMs);
        Assert.Equal(50_000, esp32.StillBlockMicros);
        Assert.Equal(linux.StillBlockMicros, esp32.StillBlockMicros);
        Assert.Equal(new LoggerSettings().StillBlockMicros, esp32.StillBlockMicros);
        Assert.Null(esp32.Validate());
    }

    [Theory]
    [InlineData(1)]
    [InlineData(120)]
    [InlineData(500)]
    public void A_still_block_in_range_is_written_in_the_runs_configuration(int stillBlockMs)
    {
        LoggerSettings settings = BoxSettings.Create(new Lis3dhAt400Hz(), stillBlockMs);
        LoggerSettings linux = BoardSettingsFile.ToLoggerSettings(
            BoardSettingsFile.Parse(Minimal.Replace("ACCEL", "\"still_block_ms\": " + stillBlockMs), "board.json"));
        Assert.Equal(stillBlockMs * 1000, settings.StillBlockMicros);
        Assert.Equal(linux.StillBlockMicros, settings.StillBlockMicros);

        byte[] log = StageAndLaunch(settings);

        LogFrames.Frame configuration = Assert.Single(LogFrames.Decode(log), f => f.Type == FrameType.Configuration);
        Assert.Equal(stillBlockMs * 1000L, LogFrames.LastVarint(configuration.Payload)); // LOG-FORMAT.md 0x01: its last field
    }

    [Theory]
    [InlineData(0)]
    [InlineData(-50)]
    [InlineData(501)]
    [InlineData(5000)]
    public void A_still_block_out_of_range_is_refused_naming_the_setting_as_the_linux_board_does(int stillBlockMs)
    {
        var e = Assert.Throws<ArgumentException>(() => BoxSettings.Create(new Lis3dhAt400Hz(), stillBlockMs));
        Assert.Equal("BoxSettings.StillBlockMs must be from 1 to 500 (was " + stillBlockMs + ")", e.Message);

        var file = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Parse(Minimal.Replace("ACCEL", "\"still_block_ms\": " + stillBlockMs), "board.json"));
        Assert.EndsWith("accelerometer.still_block_ms must be from 1 to 500 (was " + stillBlockMs + ")", file.Message);
    }

    /// <summary>The ESP32's reads (StepBudget: every 10 ms, 4 samples at 400 Hz): still for 1.5 s,
    /// then a 0.5 g launch along x; returns the log once the run has opened.</summary>
    private static byte[] StageAndLaunch(LoggerSettings settings)
    {
        var sink = new MemorySink();
        var recorder = new RunRecorder(settings, sink, new HealthCounters());
        recorder.SetCounterOrigin(0, 0);
        short[] burst = new short[12];
        long index = 0;
        for (long readMicros = 10_000; readMicros <= 2_500_000 && recorder.RunNumber == 0; readMicros += 10_000)
        {
            for (int i = 0; i < 4; i++)
            {
                long sampleMicros = (index + i + 1) * 2500;
                burst[i * 3] = (short)(sampleMicros > 1_500_000 ? 500 : 0);
                burst[(i * 3) + 1] = 0;
                burst[(i * 3) + 2] = 1000;
            }

            recorder.OnAccelBurst(burst, 4, index, readMicros);
            index += 4;
            recorder.Tick(readMicros);
        }

        Assert.Equal(1, recorder.RunNumber);
        return sink.ToArray();
    }

    /// <summary>Stands in for the LIS3DH as the ESP32 opens it (400 Hz, ±8 g); never read here.</summary>
    private sealed class Lis3dhAt400Hz : IAccelerometer
    {
        public int OutputDataRateMilliHz => 400_000;

        public int FullScaleMilliG => 8000;

        public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed) => throw new InvalidOperationException("not read in these tests");
    }
}
