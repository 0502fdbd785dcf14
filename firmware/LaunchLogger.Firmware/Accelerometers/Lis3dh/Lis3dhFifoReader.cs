using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Accelerometers.Lis3dh
{
    /// <summary>A LIS3DH on a register bus, read in bursts from its 32-sample FIFO in stream mode,
    /// as the core's <see cref="IAccelerometer"/>. Both device apps use it: the ESP32 lets it set
    /// the chip up (<see cref="Open"/>); the Linux board lets Iot.Device.Bindings set the output
    /// up and then calls <see cref="StartStreamFifo"/>.</summary>
    /// <remarks>
    /// <para>Register use (LIS3DH datasheet; FIFO behaviour in ST AN3308; both from memory):
    /// WHO_AM_I 0x0F reads 0x33; CTRL_REG1 0x20 = ODR &lt;&lt; 4 | Z Y X enable; CTRL_REG4 0x23 =
    /// FS &lt;&lt; 4 | HR; CTRL_REG5 0x24 bit 6 FIFO_EN; FIFO_CTRL_REG 0x2E mode bits 7:6 (00
    /// bypass, 10 stream); FIFO_SRC_REG 0x2F: bit 6 overrun (full), bit 5 empty, bits 4:0 stored
    /// samples; OUT_X_L 0x28..0x2D, with bit 7 of the sub-address set for auto-increment. Each
    /// sample is read with its own six-byte transfer, the access the datasheet describes for the
    /// output registers.</para>
    /// <para>Scaling follows the Iot.Device.Bindings 4.2.0 driver's <c>Lis3Dh.Acceleration</c>, so
    /// both paths on the Linux board give the same numbers: a left-justified 16-bit reading divided
    /// by counts per g = 2^15 / full scale (16384, 8192, 4096), and for ±16 g the binding's measured
    /// divisor 2^15 / 24, which its integer arithmetic truncates to 1365 (the datasheet's typical
    /// 12 mg/digit at ±16 g, i.e. 1333 counts per g, agrees within 2.5 %). The other ranges differ
    /// from the datasheet's rounded typical sensitivity (1 mg/digit at ±2 g) by 2.4 %; the host
    /// corrects gain from the resting 1 g vector in any case. Integer arithmetic only.</para>
    /// </remarks>
    public sealed class Lis3dhFifoReader : IAccelerometer
    {
        /// <summary>Samples the FIFO holds.</summary>
        public const int FifoDepth = 32;

        /// <summary>What WHO_AM_I reads on a LIS3DH.</summary>
        public const byte ChipId = 0x33;

        /// <summary>The I2C address with SDO/SA0 low.</summary>
        public const int DefaultI2cAddress = 0x18;

        /// <summary>The I2C address with SDO/SA0 high.</summary>
        public const int SecondaryI2cAddress = 0x19;

        private const byte AxesEnabled = 0x07;
        private const byte HighResolution = 0x08;
        private const byte FifoEnable = 0x40;
        private const byte FifoModeBypass = 0x00;
        private const byte FifoModeStream = 0x80;
        private const byte SourceOverrun = 0x40;
        private const byte SourceEmpty = 0x20;
        private const byte SourceLevelMask = 0x1F;

        // Largest positive reading in high-resolution mode: 12 bits left-justified.
        private const short LargestRaw = 0x7FF0;

        private readonly IRegisterBus bus;
        private readonly int rateCode;
        private readonly int fullScaleBits;
        private readonly int countsPerG;
        private readonly byte[] address = new byte[1];
        private readonly byte[] one = new byte[1];
        private readonly byte[] two = new byte[2];
        private readonly byte[] sample = new byte[6];

        /// <summary>Checks the settings; talks to the chip only when asked.</summary>
        /// <param name="bus">The register bus at the chip's address.</param>
        /// <param name="rateHz">400 or 1344 (the high-resolution rates at or above 400 Hz).</param>
        /// <param name="rangeG">Full scale: 2, 4, 8 or 16.</param>
        /// <exception cref="System.ArgumentException">An unsupported rate or range.</exception>
        public Lis3dhFifoReader(IRegisterBus bus, int rateHz, int rangeG)
        {
            if (bus == null)
            {
                throw new System.ArgumentNullException("bus");
            }

            switch (rateHz)
            {
                case 400: rateCode = 7; break;
                case 1344: rateCode = 9; break;
                default: throw new System.ArgumentException("LIS3DH rate must be 400 or 1344 Hz (was " + rateHz.ToString() + ")", "rateHz");
            }

            switch (rangeG)
            {
                case 2: fullScaleBits = 0; break;
                case 4: fullScaleBits = 1; break;
                case 8: fullScaleBits = 2; break;
                case 16: fullScaleBits = 3; break;
                default: throw new System.ArgumentException("LIS3DH range must be 2, 4, 8 or 16 g (was " + rangeG.ToString() + ")", "rangeG");
            }

            this.bus = bus;
            countsPerG = CountsPerG(rangeG);
            OutputDataRateMilliHz = rateHz * 1000;
            FullScaleMilliG = ToMilliG(LargestRaw);
        }

        /// <inheritdoc/>
        public int OutputDataRateMilliHz { get; private set; }

        /// <summary>The largest reading the range gives (mg): at or beyond it a sample is clipped.</summary>
        public int FullScaleMilliG { get; private set; }

        /// <summary>Checks the chip, sets rate, range and high-resolution mode, and starts the FIFO.</summary>
        /// <exception cref="System.ArgumentException">An unsupported rate or range.</exception>
        /// <exception cref="System.InvalidOperationException">No LIS3DH answers.</exception>
        public static Lis3dhFifoReader Open(IRegisterBus bus, int rateHz, int rangeG)
        {
            Lis3dhFifoReader reader = new Lis3dhFifoReader(bus, rateHz, rangeG);
            if (reader.ReadChipId() != ChipId)
            {
                throw new System.InvalidOperationException("no LIS3DH on the I2C bus (WHO_AM_I is not 0x33)");
            }

            reader.ConfigureOutput();
            reader.StartStreamFifo();
            return reader;
        }

        /// <summary>Counts per g of a left-justified reading at a full scale of ±<paramref name="rangeG"/>
        /// g, as the Iot.Device.Bindings driver divides (see remarks); 0 for an unsupported range.</summary>
        public static int CountsPerG(int rangeG)
        {
            switch (rangeG)
            {
                case 2: return 16384;
                case 4: return 8192;
                case 8: return 4096;
                case 16: return 32768 / 24;
                default: return 0;
            }
        }

        /// <summary>Reads WHO_AM_I (<see cref="ChipId"/> on a LIS3DH).</summary>
        /// <exception cref="System.InvalidOperationException">The chip does not answer.</exception>
        public byte ReadChipId()
        {
            return ReadRegister(Lis3dhRegister.WhoAmI);
        }

        /// <summary>Writes the output data rate with all three axes on, the full scale and
        /// high-resolution mode (CTRL_REG1, CTRL_REG4).</summary>
        /// <exception cref="System.InvalidOperationException">The chip does not answer.</exception>
        public void ConfigureOutput()
        {
            WriteRegister(Lis3dhRegister.CtrlReg1, (byte)((rateCode << 4) | AxesEnabled));
            WriteRegister(Lis3dhRegister.CtrlReg4, (byte)((fullScaleBits << 4) | HighResolution));
        }

        /// <summary>Empties the FIFO (bypass mode), sets FIFO_EN, then switches to stream mode,
        /// which keeps the newest 32 samples.</summary>
        /// <exception cref="System.InvalidOperationException">The chip does not answer.</exception>
        public void StartStreamFifo()
        {
            WriteRegister(Lis3dhRegister.FifoCtrlReg, FifoModeBypass);
            WriteRegister(Lis3dhRegister.CtrlReg5, (byte)(ReadRegister(Lis3dhRegister.CtrlReg5) | FifoEnable));
            WriteRegister(Lis3dhRegister.FifoCtrlReg, FifoModeStream);
        }

        /// <summary>Converts one left-justified 16-bit output to milli-g, rounded to nearest.</summary>
        public int ToMilliG(short raw)
        {
            // |raw| * 1000 is at most 32 768 000: no overflow in 32 bits.
            int scaled = raw * 1000;
            int half = countsPerG / 2;
            return scaled >= 0 ? (scaled + half) / countsPerG : -((-scaled + half) / countsPerG);
        }

        /// <inheritdoc/>
        public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
        {
            fifoOverflowed = false;
            address[0] = (byte)Lis3dhRegister.FifoSrcReg;
            if (!bus.WriteRead(address, one))
            {
                return -1;
            }

            byte source = one[0];
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
                if (!bus.WriteRead(address, sample))
                {
                    return -1;
                }

                int at = i * 3;
                xyzMilliG[at] = (short)ToMilliG((short)(sample[0] | (sample[1] << 8)));
                xyzMilliG[at + 1] = (short)ToMilliG((short)(sample[2] | (sample[3] << 8)));
                xyzMilliG[at + 2] = (short)ToMilliG((short)(sample[4] | (sample[5] << 8)));
            }

            return take;
        }

        private byte ReadRegister(Lis3dhRegister register)
        {
            address[0] = (byte)register;
            if (!bus.WriteRead(address, one))
            {
                throw new System.InvalidOperationException("the accelerometer does not answer on I2C");
            }

            return one[0];
        }

        private void WriteRegister(Lis3dhRegister register, byte value)
        {
            two[0] = (byte)register;
            two[1] = value;
            if (!bus.Write(two))
            {
                throw new System.InvalidOperationException("the accelerometer does not answer on I2C");
            }
        }
    }
}
