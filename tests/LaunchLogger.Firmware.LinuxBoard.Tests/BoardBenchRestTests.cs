using System.Device.Gpio;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Configuration;
using LaunchLogger.Firmware.LinuxBoard.Inputs;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.LinuxBoard.Tests;

/// <summary>The board passes its mark button to the core as it is: held 3 s on the bench (an
/// active-low GPIO input, the board's 20 ms debounce), it records a bench rest by itself.</summary>
public sealed class BoardBenchRestTests
{
    private const int MarkPin = 27;

    [Fact]
    public void The_mark_button_held_on_the_bench_records_a_complete_bench_rest()
    {
        List<LogFrames.Frame> frames = RecordOnTheBench(new LoggerSettings(), pressedFromMicros: 2_000_000, releasedAtMicros: 5_500_000, untilMicros: 27_000_000);

        Assert.All(frames, f => Assert.True(f.CrcOk));
        Assert.Single(frames, f => f.Type == FrameType.BenchRest);
        LogFrames.Frame end = Assert.Single(frames, f => f.Type == FrameType.BenchRestEnd);
        Assert.DoesNotContain(frames, f => f.Type == FrameType.Configuration);
        Assert.Equal(LogFormat.BenchRestComplete, Outcome(end));
    }

    [Fact]
    public void The_settings_files_hold_and_length_reach_the_box()
    {
        const string json = """
            {
              "car": { "pulses_per_revolution": 48, "circumference_millimetres": 1960 },
              "pulses": { "line": 17 },
              "accelerometer": { "rate_hz": 400 },
              "inputs": { "mark_pin": 27 },
              "log": { "folder": "/tmp/ll" },
              "bench_rest": { "hold_ms": 1000, "length_ms": 5000 }
            }
            """;
        LoggerSettings settings = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(json, "bench.json"));
        settings.AccelOutputDataRateMilliHz = 1_000_000; // the fake chip's true rate, as BoardApp fills it in

        // A 1.5-s press: shorter than the default 3-s hold, longer than the file's 1 s.
        List<LogFrames.Frame> frames = RecordOnTheBench(settings, pressedFromMicros: 2_000_000, releasedAtMicros: 3_500_000, untilMicros: 12_000_000);

        LogFrames.Frame open = Assert.Single(frames, f => f.Type == FrameType.BenchRest);
        LogFrames.Frame end = Assert.Single(frames, f => f.Type == FrameType.BenchRestEnd);
        long[] opened = Varints(open.Payload, 3, 3); // rest number, opened at, set length (LOG-FORMAT.md, 0x09)
        long[] ended = Varints(end.Payload, 3, 2);   // rest number, ended at (0x0A)
        Assert.Equal(5_000_000, opened[2]);
        Assert.Equal(LogFormat.BenchRestComplete, Outcome(end));
        long recordedMicros = ended[1] - opened[1];
        Assert.InRange(recordedMicros, 5_000_000, 5_000_000 + 2_000); // the first loop pass at or after 5 s

        // The same press under the defaults arms nothing.
        List<LogFrames.Frame> underDefaults = RecordOnTheBench(new LoggerSettings(), pressedFromMicros: 2_000_000, releasedAtMicros: 3_500_000, untilMicros: 12_000_000);
        Assert.DoesNotContain(underDefaults, f => f.Type == FrameType.BenchRest);
    }

    /// <summary>The board on the bench, its mark button (active low, 20 ms debounce) held from
    /// <paramref name="pressedFromMicros"/> to <paramref name="releasedAtMicros"/>.</summary>
    private static List<LogFrames.Frame> RecordOnTheBench(LoggerSettings settings, long pressedFromMicros, long releasedAtMicros, long untilMicros)
    {
        var driver = new FakeGpioDriver();
        using var controller = new GpioController(driver);
        driver.SetInput(MarkPin, PinValue.High); // released (active low)
        var counter = new ManualMicrosecondCounter();
        var sink = new MemorySink();
        using var hardware = new BoardHardware
        {
            Counter = counter,
            Pulses = new NoPulses(),
            Accelerometer = new StillAccelerometer(counter),
            AccelFifoDepth = 32,
            MarkButton = new GpioDigitalInput(controller, MarkPin, activeLow: true, PinMode.InputPullUp),
            SwitchHoldMicros = 20_000,
            Sink = sink,
        };
        var runner = new BoardRunner(settings, new HealthCounters(), hardware);
        using var stop = new CancellationTokenSource();

        runner.Run(stop.Token, () =>
        {
            counter.NowMicros += 1000;
            driver.SetInput(MarkPin, counter.NowMicros >= pressedFromMicros && counter.NowMicros < releasedAtMicros ? PinValue.Low : PinValue.High);
            if (counter.NowMicros >= untilMicros)
            {
                stop.Cancel();
            }
        });

        return LogFrames.Decode(sink.ToArray());
    }

    /// <summary>The end frame's outcome byte, after its rest number and time (LOG-FORMAT.md, 0x0A).</summary>
    private static byte Outcome(LogFrames.Frame end)
    {
        Varints(end.Payload, 3, 2, out int at);
        return end.Payload[at];
    }

    private static long[] Varints(byte[] payload, int from, int count) => Varints(payload, from, count, out _);

    /// <summary>Reads <paramref name="count"/> varints with the core's reader (LOG-FORMAT.md,
    /// section 1) from <paramref name="from"/>; <paramref name="next"/> is the offset after them.</summary>
    private static long[] Varints(byte[] payload, int from, int count, out int next)
    {
        var values = new long[count];
        int at = from;
        for (int v = 0; v < count; v++)
        {
            int read = Varint.Read(payload, at, payload.Length - 4, out ulong value);
            Assert.True(read > 0, "no varint at " + at);
            values[v] = (long)value;
            at += read;
        }

        next = at;
        return values;
    }

    private sealed class NoPulses : IPulseSource
    {
        public bool TryRead(out PulseObservation observation)
        {
            observation = default;
            return false;
        }
    }

    /// <summary>A 1 kHz accelerometer standing on its end: +1 g on x, every sample due by the counter.</summary>
    private sealed class StillAccelerometer(ManualMicrosecondCounter counter) : IAccelerometer
    {
        private long taken;

        public int OutputDataRateMilliHz => 1_000_000;

        public int FullScaleMilliG => 4000;

        public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
        {
            fifoOverflowed = false;
            int n = (int)Math.Min(maxSamples, (counter.NowMicros / 1000) - taken);
            for (int i = 0; i < n; i++)
            {
                xyzMilliG[i * 3] = 1000;
                xyzMilliG[(i * 3) + 1] = 0;
                xyzMilliG[(i * 3) + 2] = 0;
            }

            taken += n;
            return n;
        }
    }
}
