using System.Device.I2c;
using Iot.Device.Lis3DhAccelerometer;
using LaunchLogger.Firmware.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Buses;

namespace LaunchLogger.Firmware.LinuxBoard.Accelerometers.Lis3dh;

/// <summary>A LIS3DH set up by Iot.Device.Bindings and read in bursts from its 32-sample FIFO by
/// the core's <see cref="Lis3dhFifoReader"/>, as the core's <see cref="IAccelerometer"/>.</summary>
/// <remarks>
/// <para>The Iot.Device.Bindings 4.2.0 driver (<see cref="Lis3Dh"/>) sets the chip up — output
/// data rate, high-resolution mode, full scale — but offers one sample at a time
/// (<see cref="Lis3Dh.Acceleration"/>) and writes 0 to CTRL_REG5, which leaves the FIFO off.
/// Polling single samples from a time-sliced Linux process would lose samples and give each one
/// a jittery time, so after the binding's set-up the core's reader switches the FIFO to stream
/// mode and reads it through the same <see cref="I2cDevice"/>. Its scaling matches the binding's
/// (see <see cref="Lis3dhFifoReader"/>).</para>
/// <para>Binding quirk to mind: <c>Lis3Dh.SecondaryI2cAddress</c> is 0x18 in 4.2.0, the same as
/// the default; with SDO/SA0 high the chip answers at 0x19, so pass the address explicitly
/// (<see cref="SecondaryI2cAddress"/>).</para>
/// </remarks>
public sealed class Lis3dhFifoAccelerometer : IAccelerometer, IDisposable
{
    /// <summary>The address with SDO/SA0 low.</summary>
    public const int DefaultI2cAddress = Lis3dhFifoReader.DefaultI2cAddress;

    /// <summary>The address with SDO/SA0 high (the binding's constant wrongly says 0x18).</summary>
    public const int SecondaryI2cAddress = Lis3dhFifoReader.SecondaryI2cAddress;

    /// <summary>Samples the FIFO holds.</summary>
    public const int FifoDepth = Lis3dhFifoReader.FifoDepth;

    private readonly Lis3Dh binding;
    private readonly Lis3dhFifoReader reader;

    /// <summary>Sets the chip up through the binding, then turns its FIFO on in stream mode.</summary>
    /// <param name="device">The I2C device at the chip's address; owned from here on.</param>
    /// <param name="rateHz">400 or 1344 (the high-resolution rates at or above 400 Hz).</param>
    /// <param name="rangeG">Full scale: 2, 4, 8 or 16.</param>
    /// <exception cref="ArgumentException">An unsupported rate or range.</exception>
    /// <exception cref="IOException">The chip does not answer, or WHO_AM_I is not 0x33.</exception>
    public Lis3dhFifoAccelerometer(I2cDevice device, int rateHz, int rangeG)
    {
        ArgumentNullException.ThrowIfNull(device);
        var bus = new I2cDeviceRegisterBus(device);
        reader = new Lis3dhFifoReader(bus, rateHz, rangeG);
        DataRate dataRate = rateHz == 400 ? DataRate.DataRate400Hz : DataRate.HighResolutionNormal1344HzOrLowPowerMode5376Hz;
        AccelerationScale scale = rangeG switch
        {
            2 => AccelerationScale.Scale02G,
            4 => AccelerationScale.Scale04G,
            8 => AccelerationScale.Scale08G,
            _ => AccelerationScale.Scale16G,
        };

        string where = "LIS3DH at I2C address 0x" + device.ConnectionSettings.DeviceAddress.ToString("X2");
        byte id = Answer(bus, where, reader.ReadChipId);
        if (id != Lis3dhFifoReader.ChipId)
        {
            throw new IOException("no " + where + ": WHO_AM_I reads 0x" + id.ToString("X2") + ", expected 0x33");
        }

        binding = Lis3Dh.Create(device, dataRate, OperatingMode.HighResolutionMode, scale);
        Answer(bus, where, () => { reader.StartStreamFifo(); return 0; });
    }

    /// <inheritdoc/>
    public int OutputDataRateMilliHz => reader.OutputDataRateMilliHz;

    /// <summary>The largest reading the range gives (mg): at or beyond it a sample is clipped.</summary>
    public int FullScaleMilliG => reader.FullScaleMilliG;

    /// <summary>The binding, for a one-off reading (self-check); not used on the capture path.</summary>
    public Lis3Dh Binding => binding;

    /// <summary>Converts one left-justified 16-bit output to milli-g, rounded to nearest.</summary>
    public int ToMilliG(short raw) => reader.ToMilliG(raw);

    /// <inheritdoc/>
    public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed) =>
        reader.ReadBurst(xyzMilliG, maxSamples, out fifoOverflowed);

    /// <summary>Releases the I2C device (through the binding, which owns it).</summary>
    public void Dispose()
    {
        binding.Dispose();
    }

    // The core reader reports a silent bus as InvalidOperationException; here it is the I2C
    // failure it came from, an IOException naming the chip and the kernel's reason.
    private static T Answer<T>(I2cDeviceRegisterBus bus, string where, Func<T> step)
    {
        try
        {
            return step();
        }
        catch (InvalidOperationException e) when (bus.LastFailure != null)
        {
            throw new IOException(where + " does not answer: " + bus.LastFailure.Message, e);
        }
    }
}
