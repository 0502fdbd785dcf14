using System.Device.Gpio;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;
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
        var runner = new BoardRunner(new LoggerSettings(), new HealthCounters(), hardware);
        using var stop = new CancellationTokenSource();

        runner.Run(stop.Token, () =>
        {
            counter.NowMicros += 1000;
            driver.SetInput(MarkPin, counter.NowMicros is >= 2_000_000 and < 5_500_000 ? PinValue.Low : PinValue.High);
            if (counter.NowMicros >= 27_000_000)
            {
                stop.Cancel();
            }
        });

        List<LogFrames.Frame> frames = LogFrames.Decode(sink.ToArray());
        Assert.All(frames, f => Assert.True(f.CrcOk));
        Assert.Single(frames, f => f.Type == FrameType.BenchRest);
        LogFrames.Frame end = Assert.Single(frames, f => f.Type == FrameType.BenchRestEnd);
        Assert.DoesNotContain(frames, f => f.Type == FrameType.Configuration);

        // The end frame's outcome byte follows its rest number and time (LOG-FORMAT.md, 0x0A):
        // one-byte varint 1, then the time's varint.
        int at = 3 + 1;
        while ((end.Payload[at] & 0x80) != 0)
        {
            at++;
        }

        Assert.Equal(LogFormat.BenchRestComplete, end.Payload[at + 1]);
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
