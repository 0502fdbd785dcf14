using LaunchLogger.Firmware.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Accelerometers.Lis3dh;

public class Lis3dhFifoReaderTests
{
    [Theory]
    [InlineData("400 Hz, ±2 g", 400, 2, 0x77, 0x08)]
    [InlineData("400 Hz, ±8 g", 400, 8, 0x77, 0x28)]
    [InlineData("1344 Hz, ±8 g", 1344, 8, 0x97, 0x28)]
    [InlineData("1344 Hz, ±16 g", 1344, 16, 0x97, 0x38)]
    public void Open_sets_rate_range_and_high_resolution_then_a_stream_mode_fifo(string name, int rateHz, int rangeG, byte ctrl1, byte ctrl4)
    {
        // CTRL_REG1 = ODR << 4 | Zen Yen Xen (ODR 7 = 400 Hz, 9 = 1344 Hz); CTRL_REG4 = FS << 4 | HR;
        // CTRL_REG5 bit 6 FIFO_EN; FIFO_CTRL_REG bits 7:6 = 10 stream (LIS3DH datasheet, from memory).
        _ = name;
        var chip = new FakeLis3dhBus();
        var reader = Lis3dhFifoReader.Open(chip, rateHz, rangeG);

        Assert.Equal(ctrl1, chip.Register(0x20));
        Assert.Equal(ctrl4, chip.Register(0x23));
        Assert.Equal(0x40, chip.Register(0x24));
        Assert.Equal(0x80, chip.Register(0x2E));
        Assert.Equal(rateHz * 1000, reader.OutputDataRateMilliHz);
    }

    [Fact]
    public void Starting_the_fifo_empties_it_in_bypass_first_and_keeps_other_ctrl_reg5_bits()
    {
        var chip = new FakeLis3dhBus();
        chip.SetRegister(0x24, 0x08);
        var reader = new Lis3dhFifoReader(chip, 400, 2);

        reader.StartStreamFifo();

        Assert.Equal(new[] { (0x2E, (byte)0x00), (0x24, (byte)0x48), (0x2E, (byte)0x80) }, chip.Writes);
    }

    [Theory]
    [InlineData("±2 g, 1 g", 2, 0x4000, 1000)]
    [InlineData("±2 g, −1 g", 2, -0x4000, -1000)]
    [InlineData("±4 g, 1 g", 4, 0x2000, 1000)]
    [InlineData("±8 g, 1 g", 8, 0x1000, 1000)]
    [InlineData("±8 g, largest", 8, 0x7FF0, 7996)]
    [InlineData("±8 g, smallest", 8, -0x8000, -8000)]
    [InlineData("±16 g, largest", 16, 0x7FF0, 23994)]
    [InlineData("±2 g, one 12-bit step", 2, 0x0010, 1)]
    [InlineData("±2 g, 1.25 g", 2, 0x5000, 1250)]
    public void Converts_left_justified_counts_to_milli_g(string name, int rangeG, int raw, int expectedMilliG)
    {
        // Counts per g = 2^15 / full scale (the Iot.Device.Bindings 4.2.0 driver's convention;
        // ±16 g uses its 2^15 / 24 = 1365). The LinuxBoard tests check the same path against
        // that driver's own reading.
        _ = name;
        var reader = new Lis3dhFifoReader(new FakeLis3dhBus(), 400, rangeG);
        Assert.Equal(expectedMilliG, reader.ToMilliG((short)raw));
    }

    [Theory]
    [InlineData(2, 16384)]
    [InlineData(4, 8192)]
    [InlineData(8, 4096)]
    [InlineData(16, 1365)]
    [InlineData(3, 0)]
    public void Counts_per_g_per_full_scale(int rangeG, int expected)
    {
        Assert.Equal(expected, Lis3dhFifoReader.CountsPerG(rangeG));
    }

    [Fact]
    public void Conversion_rounds_to_nearest_and_is_symmetric_over_the_whole_range()
    {
        foreach (int rangeG in new[] { 2, 4, 8, 16 })
        {
            var reader = new Lis3dhFifoReader(new FakeLis3dhBus(), 400, rangeG);
            double countsPerG = Lis3dhFifoReader.CountsPerG(rangeG);
            for (int raw = -32767; raw <= short.MaxValue; raw += 7)
            {
                int milliG = reader.ToMilliG((short)raw);
                Assert.Equal(Math.Round(raw * 1000.0 / countsPerG, MidpointRounding.AwayFromZero), milliG);
                Assert.Equal(-milliG, reader.ToMilliG((short)-raw));
            }
        }
    }

    [Fact]
    public void A_burst_takes_every_stored_sample_oldest_first()
    {
        var chip = new FakeLis3dhBus();
        var reader = Lis3dhFifoReader.Open(chip, 1344, 8);
        for (int i = 1; i <= 10; i++)
        {
            chip.Produce((short)(i * 0x100), 0, 0x1000);
        }

        var burst = new short[32 * 3];
        int n = reader.ReadBurst(burst, 32, out bool overflowed);

        Assert.Equal(10, n);
        Assert.False(overflowed);
        for (int i = 0; i < 10; i++)
        {
            Assert.Equal(reader.ToMilliG((short)((i + 1) * 0x100)), burst[i * 3]);
            Assert.Equal(1000, burst[(i * 3) + 2]);
        }

        Assert.Equal(0, reader.ReadBurst(burst, 32, out overflowed));
        Assert.False(overflowed);
    }

    [Fact]
    public void A_burst_stops_at_the_callers_limit_and_the_rest_waits()
    {
        var chip = new FakeLis3dhBus();
        var reader = Lis3dhFifoReader.Open(chip, 1344, 8);
        for (int i = 1; i <= 10; i++)
        {
            chip.Produce((short)(i * 0x100), 0, 0);
        }

        var burst = new short[6 * 3];
        Assert.Equal(6, reader.ReadBurst(burst, 6, out _));
        Assert.Equal(reader.ToMilliG(0x600), burst[15]);
        Assert.Equal(4, reader.ReadBurst(burst, 6, out _));
        Assert.Equal(reader.ToMilliG(0x700), burst[0]);
    }

    [Fact]
    public void A_full_fifo_reports_overflow_and_gives_the_newest_32()
    {
        var chip = new FakeLis3dhBus();
        var reader = Lis3dhFifoReader.Open(chip, 400, 2);
        for (int i = 1; i <= 40; i++)
        {
            chip.Produce((short)(i * 0x10), 0, 0);
        }

        var burst = new short[32 * 3];
        int n = reader.ReadBurst(burst, 32, out bool overflowed);

        Assert.Equal(8, chip.SamplesLost);
        Assert.True(overflowed);
        Assert.Equal(32, n);
        Assert.Equal(reader.ToMilliG(9 * 0x10), burst[0]);
        Assert.Equal(reader.ToMilliG(40 * 0x10), burst[31 * 3]);
    }

    [Fact]
    public void A_failed_transfer_is_a_failed_read_not_an_exception()
    {
        var chip = new FakeLis3dhBus();
        var reader = Lis3dhFifoReader.Open(chip, 400, 2);
        chip.Produce(0x100, 0, 0);
        chip.Fail = true;

        Assert.Equal(-1, reader.ReadBurst(new short[96], 32, out bool overflowed));
        Assert.False(overflowed);
    }

    [Fact]
    public void Full_scale_is_the_largest_reading_so_saturation_counts_as_clipped()
    {
        var reader = new Lis3dhFifoReader(new FakeLis3dhBus(), 400, 8);
        Assert.Equal(reader.ToMilliG(0x7FF0), reader.FullScaleMilliG);
        Assert.True(reader.ToMilliG(short.MinValue) <= -reader.FullScaleMilliG);
    }

    [Fact]
    public void A_chip_that_is_not_a_LIS3DH_is_refused()
    {
        var chip = new FakeLis3dhBus();
        chip.SetRegister(0x0F, 0x68);
        Assert.Throws<InvalidOperationException>(() => Lis3dhFifoReader.Open(chip, 400, 2));
        Assert.Empty(chip.Writes);
    }

    [Fact]
    public void A_silent_bus_at_set_up_is_an_exception()
    {
        var chip = new FakeLis3dhBus { Fail = true };
        Assert.Throws<InvalidOperationException>(() => Lis3dhFifoReader.Open(chip, 400, 2));
    }

    [Theory]
    [InlineData(100, 2, "rate")]
    [InlineData(400, 3, "range")]
    public void Unsupported_rate_or_range_is_refused_before_any_transfer(int rateHz, int rangeG, string named)
    {
        var chip = new FakeLis3dhBus();
        var e = Assert.Throws<ArgumentException>(() => new Lis3dhFifoReader(chip, rateHz, rangeG));
        Assert.Contains(named, e.Message);
        Assert.Empty(chip.Writes);
    }
}
