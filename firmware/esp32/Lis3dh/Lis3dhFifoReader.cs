#nullable disable
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Lis3dh
{
    /// <summary>A LIS3DH on a register bus, set up for high-resolution output into its 32-sample
    /// FIFO in stream mode and read in bursts, as the core's <see cref="IAccelerometer"/>.</summary>
    /// <remarks>
    /// Register use (LIS3DH datasheet; from memory): WHO_AM_I 0x0F reads 0x33; CTRL_REG1 0x20 =
    /// ODR &lt;&lt; 4 | Z Y X enable; CTRL_REG4 0x23 = FS &lt;&lt; 4 | HR; CTRL_REG5 0x24 bit 6
    /// FIFO_EN; FIFO_CTRL_REG 0x2E mode bits 7:6 (00 bypass, 10 stream); FIFO_SRC_REG 0x2F: bit 6
    /// overrun (full), bit 5 empty, bits 4:0 stored samples; OUT_X_L 0x28..0x2D, with bit 7 of the
    /// sub-address set for auto-increment. Each sample is read with its own six-byte transfer.
    /// Counts per g match the Linux board's reader (which follows the Iot.Device.Bindings driver),
    /// so both boards log the same milli-g for the same raw data: 2^15 / full scale, and 1365
    /// (2^15 / 24, truncated) at ±16 g. Integer arithmetic only: no System.Math on the device.
    /// </remarks>
    public sealed class Lis3dhFifoReader : IAccelerometer
    {
        /// <summary>The FIFO's depth in samples.</summary>
        public const int FifoDepth = 32;

        /// <summary>ODR code for 400 Hz.</summary>
        public const int Rate400Hz = 7;

        /// <summary>ODR code for 1344 Hz (high-resolution/normal mode).</summary>
        public const int Rate1344Hz = 9;

        private const byte WhoAmI = 0x0F;
        private const byte CtrlReg1 = 0x20;
        private const byte CtrlReg4 = 0x23;
        private const byte CtrlReg5 = 0x24;
        private const byte OutXLow = 0x28;
        private const byte FifoCtrlReg = 0x2E;
        private const byte FifoSrcReg = 0x2F;
        private const byte AutoIncrement = 0x80;
        private const short LargestRaw = 0x7FF0;

        private readonly IRegisterBus bus;
        private readonly int countsPerG;
        private readonly byte[] address = new byte[1];
        private readonly byte[] one = new byte[1];
        private readonly byte[] two = new byte[2];
        private readonly byte[] sample = new byte[6];

        /// <summary>Checks the chip and sets it up.</summary>
        /// <param name="bus">The register bus at the chip's address.</param>
        /// <param name="rateCode"><see cref="Rate400Hz"/> or <see cref="Rate1344Hz"/>.</param>
        /// <param name="rangeG">2, 4, 8 or 16.</param>
        /// <exception cref="System.ArgumentException">An unsupported rate or range.</exception>
        /// <exception cref="System.InvalidOperationException">No LIS3DH answers.</exception>
        public Lis3dhFifoReader(IRegisterBus bus, int rateCode, int rangeG)
        {
            if (bus == null)
            {
                throw new System.ArgumentNullException("bus");
            }

            if (rateCode != Rate400Hz && rateCode != Rate1344Hz)
            {
                throw new System.ArgumentException("rateCode");
            }

            int fullScaleBits;
            switch (rangeG)
            {
                case 2: fullScaleBits = 0; countsPerG = 16384; break;
                case 4: fullScaleBits = 1; countsPerG = 8192; break;
                case 8: fullScaleBits = 2; countsPerG = 4096; break;
                case 16: fullScaleBits = 3; countsPerG = 1365; break;
                default: throw new System.ArgumentException("rangeG");
            }

            this.bus = bus;
            if (ReadRegister(WhoAmI) != 0x33)
            {
                throw new System.InvalidOperationException("no LIS3DH on the I2C bus (WHO_AM_I is not 0x33)");
            }

            OutputDataRateMilliHz = rateCode == Rate400Hz ? 400000 : 1344000;
            FullScaleMilliG = ToMilliG(LargestRaw);
            WriteRegister(CtrlReg1, (byte)((rateCode << 4) | 0x07));
            WriteRegister(CtrlReg4, (byte)((fullScaleBits << 4) | 0x08));
            WriteRegister(FifoCtrlReg, 0x00);
            WriteRegister(CtrlReg5, 0x40);
            WriteRegister(FifoCtrlReg, 0x80);
        }

        /// <inheritdoc/>
        public int OutputDataRateMilliHz { get; private set; }

        /// <inheritdoc/>
        public int FullScaleMilliG { get; private set; }

        /// <summary>Converts one left-justified 16-bit output to milli-g, rounded to nearest.</summary>
        public int ToMilliG(short raw)
        {
            int scaled = raw * 1000;
            int half = countsPerG / 2;
            return scaled >= 0 ? (scaled + half) / countsPerG : -((-scaled + half) / countsPerG);
        }

        /// <inheritdoc/>
        public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
        {
            fifoOverflowed = false;
            address[0] = FifoSrcReg;
            if (!bus.WriteRead(address, one))
            {
                return -1;
            }

            byte source = one[0];
            if ((source & 0x20) != 0)
            {
                return 0;
            }

            bool full = (source & 0x40) != 0;
            int stored = full ? FifoDepth : source & 0x1F;
            fifoOverflowed = full;
            int take = stored < maxSamples ? stored : maxSamples;
            address[0] = OutXLow | AutoIncrement;
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

        private byte ReadRegister(byte register)
        {
            address[0] = register;
            if (!bus.WriteRead(address, one))
            {
                throw new System.InvalidOperationException("the accelerometer does not answer on I2C");
            }

            return one[0];
        }

        private void WriteRegister(byte register, byte value)
        {
            two[0] = register;
            two[1] = value;
            if (!bus.Write(two))
            {
                throw new System.InvalidOperationException("the accelerometer does not answer on I2C");
            }
        }
    }
}
