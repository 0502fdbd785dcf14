using LaunchLogger.Firmware.LinuxBoard.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Accelerometers;

public class Lis3dhFifoAccelerometerTests
{
    [Theory]
    [InlineData("400 Hz, ±2 g", 400, 2, 0x77, 0x08)]
    [InlineData("1344 Hz, ±8 g", 1344, 8, 0x97, 0x28)]
    [InlineData("1344 Hz, ±16 g", 1344, 16, 0x97, 0x38)]
    public void Set_up_goes_through_the_binding_then_turns_the_fifo_on(string name, int rateHz, int rangeG, byte ctrl1, byte ctrl4)
    {
        // CTRL_REG1 = ODR << 4 | Zen Yen Xen; CTRL_REG4 = FS << 4 | HR (LIS3DH datasheet, from memory).
        _ = name;
        var chip = new EmulatedLis3dh();
        using var sensor = new Lis3dhFifoAccelerometer(chip, rateHz, rangeG);

        Assert.Equal(ctrl1, chip.Register(0x20));
        Assert.Equal(ctrl4, chip.Register(0x23));
        Assert.Equal(0x40, chip.Register(0x24) & 0x40);
        Assert.Equal(0x80, chip.Register(0x2E) & 0xC0);
        Assert.Equal(rateHz * 1000, sensor.OutputDataRateMilliHz);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(4)]
    [InlineData(8)]
    [InlineData(16)]
    public void Fifo_path_agrees_with_the_bindings_own_reading(int rangeG)
    {
        // Reference: Iot.Device.Bindings 4.2.0's Lis3Dh.Acceleration (g) on the same register bytes.
        var chip = new EmulatedLis3dh();
        using var sensor = new Lis3dhFifoAccelerometer(chip, 1344, rangeG);
        short[] raws = { 0x7FF0, 0x4000, 0x1230, 0x0010, 0, -0x0010, -0x2BC0, -0x8000 };
        var burst = new short[3];
        foreach (short raw in raws)
        {
            chip.Produce(raw, (short)-raw, (short)(raw / 2 & ~0xF));
            System.Numerics.Vector3 g = sensor.Binding.Acceleration;
            chip.Produce(raw, (short)-raw, (short)(raw / 2 & ~0xF));
            Assert.Equal(1, sensor.ReadBurst(burst, 1, out _));

            Assert.Equal(g.X * 1000, burst[0], 0.5);
            Assert.Equal(g.Y * 1000, burst[1], 0.5);
            Assert.Equal(g.Z * 1000, burst[2], 0.5);
        }
    }

    [Fact]
    public void A_burst_reads_the_fifo_through_the_i2c_device_after_the_bindings_set_up()
    {
        // The FIFO logic itself is tested on the core's reader (LaunchLogger.Firmware.Tests);
        // this checks the wiring: binding set-up, FIFO on, reads over the same I2cDevice.
        var chip = new EmulatedLis3dh();
        using var sensor = new Lis3dhFifoAccelerometer(chip, 400, 2);
        for (int i = 1; i <= 40; i++)
        {
            chip.Produce((short)(i * 0x10), 0, 0x4000);
        }

        var burst = new short[32 * 3];
        Assert.Equal(32, sensor.ReadBurst(burst, 32, out bool overflowed));
        Assert.True(overflowed);
        Assert.Equal(sensor.ToMilliG(9 * 0x10), burst[0]);
        Assert.Equal(1000, burst[2]);
        Assert.Equal(0, sensor.ReadBurst(burst, 32, out _));
    }

    [Fact]
    public void A_bus_error_is_a_failed_read_not_an_exception()
    {
        var chip = new EmulatedLis3dh();
        using var sensor = new Lis3dhFifoAccelerometer(chip, 400, 2);
        chip.Produce(0x100, 0, 0);
        chip.FailTransfers = true;

        Assert.Equal(-1, sensor.ReadBurst(new short[96], 32, out bool overflowed));
        Assert.False(overflowed);
    }

    [Fact]
    public void A_chip_that_is_not_a_LIS3DH_is_refused()
    {
        var chip = new EmulatedLis3dh();
        chip.SetRegister(0x0F, 0x68);
        var e = Assert.Throws<IOException>(() => new Lis3dhFifoAccelerometer(chip, 400, 2));
        Assert.Contains("0x68", e.Message);
    }

    [Fact]
    public void A_chip_that_does_not_answer_is_an_io_error_naming_its_address()
    {
        var chip = new EmulatedLis3dh(0x19) { FailTransfers = true };
        var e = Assert.Throws<IOException>(() => new Lis3dhFifoAccelerometer(chip, 400, 2));
        Assert.Contains("0x19", e.Message);
        Assert.Contains("Error 121", e.Message);
    }

    [Theory]
    [InlineData(100, 2)]
    [InlineData(400, 3)]
    public void Unsupported_rate_or_range_is_refused(int rateHz, int rangeG)
    {
        Assert.Throws<ArgumentException>(() => new Lis3dhFifoAccelerometer(new EmulatedLis3dh(), rateHz, rangeG));
    }

    [Fact]
    public void The_bindings_secondary_address_constant_is_wrong_so_ours_is_used()
    {
        // Iot.Device.Bindings 4.2.0 declares SecondaryI2cAddress = 0x18, equal to the default; the
        // chip answers at 0x19 with SDO/SA0 high (LIS3DH datasheet, I2C section; from memory).
        Assert.Equal(Iot.Device.Lis3DhAccelerometer.Lis3Dh.DefaultI2cAddress, Iot.Device.Lis3DhAccelerometer.Lis3Dh.SecondaryI2cAddress);
        Assert.Equal(0x19, Lis3dhFifoAccelerometer.SecondaryI2cAddress);
    }
}
