using System.Device.I2c;
using Iot.Device.Lis3DhAccelerometer;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Accelerometers.Lis3dh;

/// <summary>A LIS3DH read in bursts from its 32-sample FIFO, as the core's
/// <see cref="IAccelerometer"/>.</summary>
/// <remarks>
/// <para>The Iot.Device.Bindings 4.2.0 driver (<see cref="Lis3Dh"/>) sets the chip up — output
/// data rate, high-resolution mode, full scale — but offers one sample at a time
/// (<see cref="Lis3Dh.Acceleration"/>) and writes 0 to CTRL_REG5, which leaves the FIFO off.
/// Polling single samples from a time-sliced Linux process would lose samples and give each one
/// a jittery time, so after the binding's set-up this class switches the FIFO to stream mode and
/// reads it itself through the same <see cref="I2cDevice"/>: FIFO_SRC_REG for the fill level,
/// then six output bytes per sample (one I2C transfer per sample, the access the datasheet
/// describes for the output registers).</para>
/// <para>Scaling matches the binding's <see cref="Lis3Dh.Acceleration"/>, so both paths give the
/// same numbers: a left-justified 16-bit reading divided by counts per g = 2^15 / full scale
/// (16384, 8192, 4096), and for ±16 g the binding's measured divisor 2^15 / 24, which its integer
/// arithmetic truncates to 1365 (the datasheet's typical 12 mg/digit at ±16 g, i.e. 1333 counts
/// per g, agrees within 2.5 %). The other ranges differ from the datasheet's rounded typical
/// sensitivity (1 mg/digit at ±2 g) by 2.4 %; the host corrects gain from the resting 1 g vector
/// in any case.</para>
/// <para>Binding quirk to mind: <c>Lis3Dh.SecondaryI2cAddress</c> is 0x18 in 4.2.0, the same as
/// the default; with SDO/SA0 high the chip answers at 0x19, so pass the address explicitly
/// (<see cref="SecondaryI2cAddress"/>).</para>
/// </remarks>
public sealed class Lis3dhFifoAccelerometer : IAccelerometer, IDisposable
{
    /// <summary>The address with SDO/SA0 low.</summary>
    public const int DefaultI2cAddress = 0x18;

    /// <summary>The address with SDO/SA0 high (the binding's constant wrongly says 0x18).</summary>
    public const int SecondaryI2cAddress = 0x19;

    /// <summary>Samples the FIFO holds.</summary>
    public const int FifoDepth = 32;

    /// <summary>What WHO_AM_I reads on a LIS3DH.</summary>
    public const byte ChipId = 0x33;

    private const byte FifoEnable = 0x40;
    private const byte FifoModeBypass = 0x00;
    private const byte FifoModeStream = 0x80;
    private const byte SourceOverrun = 0x40;
    private const byte SourceEmpty = 0x20;
    private const byte SourceLevelMask = 0x1F;

    // Largest positive reading in high-resolution mode: 12 bits left-justified.
    private const short LargestRaw = 0x7FF0;

    private readonly Lis3Dh binding;
    private readonly I2cDevice device;
    private readonly int countsPerG;
    private readonly byte[] address = new byte[1];
    private readonly byte[] one = new byte[1];
    private readonly byte[] sample = new byte[6];
    private readonly byte[] write2 = new byte[2];

    /// <summary>Sets the chip up through the binding, then turns its FIFO on in stream mode.</summary>
    /// <param name="device">The I2C device at the chip's address; owned from here on.</param>
    /// <param name="rateHz">400 or 1344 (the high-resolution rates at or above 400 Hz).</param>
    /// <param name="rangeG">Full scale: 2, 4, 8 or 16.</param>
    /// <exception cref="ArgumentException">An unsupported rate or range.</exception>
    /// <exception cref="IOException">The chip does not answer, or WHO_AM_I is not 0x33.</exception>
    public Lis3dhFifoAccelerometer(I2cDevice device, int rateHz, int rangeG)
    {
        this.device = device ?? throw new ArgumentNullException(nameof(device));
        DataRate dataRate = rateHz switch
        {
            400 => DataRate.DataRate400Hz,
            1344 => DataRate.HighResolutionNormal1344HzOrLowPowerMode5376Hz,
            _ => throw new ArgumentException("LIS3DH rate must be 400 or 1344 Hz (was " + rateHz + ")", nameof(rateHz)),
        };
        AccelerationScale scale = rangeG switch
        {
            2 => AccelerationScale.Scale02G,
            4 => AccelerationScale.Scale04G,
            8 => AccelerationScale.Scale08G,
            16 => AccelerationScale.Scale16G,
            _ => throw new ArgumentException("LIS3DH range must be 2, 4, 8 or 16 g (was " + rangeG + ")", nameof(rangeG)),
        };

        byte id = ReadRegister(Lis3dhRegister.WhoAmI);
        if (id != ChipId)
        {
            throw new IOException("no LIS3DH at I2C address 0x" + device.ConnectionSettings.DeviceAddress.ToString("X2") + ": WHO_AM_I reads 0x" + id.ToString("X2") + ", expected 0x33");
        }

        // Counts per g, as the binding divides (see remarks).
        countsPerG = rangeG == 16 ? 32768 / 24 : 32768 / rangeG;
        binding = Lis3Dh.Create(device, dataRate, OperatingMode.HighResolutionMode, scale);
        OutputDataRateMilliHz = rateHz * 1000;
        FullScaleMilliG = ToMilliG(LargestRaw);

        // Bypass first empties the FIFO; then stream mode keeps the newest 32 samples.
        WriteRegister(Lis3dhRegister.FifoCtrlReg, FifoModeBypass);
        WriteRegister(Lis3dhRegister.CtrlReg5, (byte)(ReadRegister(Lis3dhRegister.CtrlReg5) | FifoEnable));
        WriteRegister(Lis3dhRegister.FifoCtrlReg, FifoModeStream);
    }

    /// <inheritdoc/>
    public int OutputDataRateMilliHz { get; }

    /// <summary>The largest reading the range gives (mg): at or beyond it a sample is clipped.</summary>
    public int FullScaleMilliG { get; }

    /// <summary>The binding, for a one-off reading (self-check); not used on the capture path.</summary>
    public Lis3Dh Binding => binding;

    /// <summary>Converts one left-justified 16-bit output to milli-g, rounded to nearest.</summary>
    public int ToMilliG(short raw)
    {
        long scaled = (long)raw * 1000;
        long half = countsPerG / 2;
        return (int)(scaled >= 0 ? (scaled + half) / countsPerG : -((-scaled + half) / countsPerG));
    }

    /// <inheritdoc/>
    public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
    {
        fifoOverflowed = false;
        try
        {
            byte source = ReadRegister(Lis3dhRegister.FifoSrcReg);
            if ((source & SourceEmpty) != 0)
            {
                return 0;
            }

            // FSS counts 0..31; a full FIFO (32 samples) shows as overrun with FSS 31 (from memory,
            // ST AN3308's FIFO_SRC_REG table). In stream mode a full FIFO overwrites its oldest
            // sample next, so it is reported as an overflow.
            bool full = (source & SourceOverrun) != 0;
            int stored = full ? FifoDepth : source & SourceLevelMask;
            fifoOverflowed = full;
            int take = stored < maxSamples ? stored : maxSamples;
            address[0] = (byte)((byte)Lis3dhRegister.OutXLow | (byte)Lis3dhRegister.AutoIncrement);
            for (int i = 0; i < take; i++)
            {
                device.WriteRead(address, sample);
                int at = i * 3;
                xyzMilliG[at] = (short)ToMilliG((short)(sample[0] | (sample[1] << 8)));
                xyzMilliG[at + 1] = (short)ToMilliG((short)(sample[2] | (sample[3] << 8)));
                xyzMilliG[at + 2] = (short)ToMilliG((short)(sample[4] | (sample[5] << 8)));
            }

            return take;
        }
        catch (IOException)
        {
            return -1;
        }
    }

    /// <summary>Releases the I2C device (through the binding, which owns it).</summary>
    public void Dispose()
    {
        binding.Dispose();
    }

    private byte ReadRegister(Lis3dhRegister register)
    {
        address[0] = (byte)register;
        device.WriteRead(address, one);
        return one[0];
    }

    private void WriteRegister(Lis3dhRegister register, byte value)
    {
        write2[0] = (byte)register;
        write2[1] = value;
        device.Write(write2);
    }
}
