using LaunchLogger.Esp32.Glue;
using LaunchLogger.Esp32.Lis3dh;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.LinuxBoard.Inputs;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Esp32;

/// <summary>The ESP32 firmware's portable parts, compiled here from firmware/esp32.</summary>
public class Esp32PortableTests
{
    [Fact]
    public void Esp32_reader_sets_the_chip_up_for_stream_mode_fifo()
    {
        var chip = new EmulatedLis3dh();
        var reader = new Lis3dhFifoReader(new EmulatedBus(chip), Lis3dhFifoReader.Rate400Hz, 8);

        Assert.Equal(0x77, chip.Register(0x20));
        Assert.Equal(0x28, chip.Register(0x23));
        Assert.Equal(0x40, chip.Register(0x24) & 0x40);
        Assert.Equal(0x80, chip.Register(0x2E));
        Assert.Equal(400_000, reader.OutputDataRateMilliHz);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    [InlineData(16)]
    public void Both_boards_log_the_same_milli_g_for_the_same_raw_data(int rangeG)
    {
        var esp = new Lis3dhFifoReader(new EmulatedBus(new EmulatedLis3dh()), Lis3dhFifoReader.Rate1344Hz, rangeG);
        using var linux = new Lis3dhFifoAccelerometer(new EmulatedLis3dh(), 1344, rangeG);

        for (int raw = short.MinValue; raw <= short.MaxValue; raw += 16)
        {
            Assert.Equal(linux.ToMilliG((short)raw), esp.ToMilliG((short)raw));
        }

        Assert.Equal(linux.FullScaleMilliG, esp.FullScaleMilliG);
    }

    [Fact]
    public void Esp32_reader_bursts_overflows_and_failures()
    {
        var chip = new EmulatedLis3dh();
        var bus = new EmulatedBus(chip);
        var reader = new Lis3dhFifoReader(bus, Lis3dhFifoReader.Rate400Hz, 2);
        var burst = new short[32 * 3];

        Assert.Equal(0, reader.ReadBurst(burst, 32, out bool overflowed));
        for (int i = 1; i <= 5; i++)
        {
            chip.Produce((short)(i * 0x1000), 0, 0x4000);
        }

        Assert.Equal(5, reader.ReadBurst(burst, 32, out overflowed));
        Assert.False(overflowed);
        Assert.Equal(1250, burst[4 * 3]); // 0x5000 counts at 16384 per g = 1.25 g
        Assert.Equal(1000, burst[(4 * 3) + 2]);

        for (int i = 0; i < 35; i++)
        {
            chip.Produce(0, 0, 0x4000);
        }

        Assert.Equal(32, reader.ReadBurst(burst, 32, out overflowed));
        Assert.True(overflowed);

        chip.Produce(0, 0, 0x4000);
        bus.Fail = true;
        Assert.Equal(-1, reader.ReadBurst(burst, 32, out _));
    }

    [Fact]
    public void Esp32_reader_refuses_a_chip_that_is_not_a_LIS3DH()
    {
        var chip = new EmulatedLis3dh();
        chip.SetRegister(0x0F, 0x00);
        Assert.Throws<InvalidOperationException>(() => new Lis3dhFifoReader(new EmulatedBus(chip), Lis3dhFifoReader.Rate400Hz, 2));
    }

    [Fact]
    public void Each_capture_step_polls_the_counter_exactly_once()
    {
        var health = new HealthCounters();
        var time = new ManualMicrosecondCounter { NowMicros = 1000 };
        var clock = new MonotonicClock(time, health);
        var counter = new SteppingCounter();
        var source = new PollOnEachStep(new PolledPulseSource(counter, clock));
        var recorder = new RunRecorder(new LoggerSettings { AccelPresent = false }, new MemorySink(), health);
        recorder.SetCounterOrigin(0, 0);
        var loop = new CaptureLoop(clock, source, null, null, null, null, recorder, 1, 0);

        for (int step = 1; step <= 5; step++)
        {
            time.NowMicros += 100;
            counter.Count += 2;
            loop.Step();
            Assert.Equal(step, source.Polls);
        }

        Assert.Equal(10, counter.Count);
    }

    [Fact]
    public void Esp32_led_patterns_match_the_linux_boards()
    {
        foreach (RunPhase phase in Enum.GetValues<RunPhase>())
        {
            for (long ms = 0; ms < 4000; ms++)
            {
                Assert.Equal(LedPattern.IsOn(phase, ms), BlinkPattern.IsOn(phase, ms));
            }
        }
    }

    private sealed class EmulatedBus : IRegisterBus
    {
        private readonly EmulatedLis3dh chip;

        public EmulatedBus(EmulatedLis3dh chip) => this.chip = chip;

        public bool Fail { get; set; }

        public bool Write(byte[] data)
        {
            if (Fail)
            {
                return false;
            }

            chip.Write(data);
            return true;
        }

        public bool WriteRead(byte[] write, byte[] read)
        {
            if (Fail)
            {
                return false;
            }

            chip.WriteRead(write, read);
            return true;
        }
    }

    private sealed class SteppingCounter : IPulseCounter
    {
        public long Count { get; set; }

        public int ChannelCount => 1;

        public long ReadCount(int channel) => Count;
    }
}
