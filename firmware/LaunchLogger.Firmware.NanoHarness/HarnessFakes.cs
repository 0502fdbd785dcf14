using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.NanoHarness
{
    /// <summary>A 32-bit microsecond counter the harness sets by hand (it wraps like the device's).</summary>
    public sealed class HandClock : IMicrosecondCounter
    {
        /// <summary>Microseconds since power-up; the counter shows the low 32 bits.</summary>
        public long Micros;

        /// <inheritdoc/>
        public uint ReadMicros32()
        {
            return (uint)(Micros & 0xFFFFFFFFL);
        }
    }

    /// <summary>A hardware edge counter with one channel, set by the harness.</summary>
    public sealed class HandPulseCounter : IPulseCounter
    {
        /// <summary>The count the counter shows.</summary>
        public long Count;

        /// <inheritdoc/>
        public int ChannelCount
        {
            get { return 1; }
        }

        /// <inheritdoc/>
        public long ReadCount(int channel)
        {
            return Count;
        }
    }

    /// <summary>An accelerometer whose FIFO fills at its data rate from a constant forward
    /// acceleration the harness sets; at most <see cref="Depth"/> samples are kept.</summary>
    public sealed class HandAccelerometer : IAccelerometer
    {
        /// <summary>FIFO depth, like the LIS3DH's.</summary>
        public const int Depth = 32;

        private readonly HandClock clock;
        private readonly long periodMicros;
        private long nextSampleMicros;
        private int stored;
        private bool overflowed;

        /// <summary>Forward acceleration now (mg); x is forward, z carries gravity.</summary>
        public int ForwardMilliG;

        /// <summary>Samples handed out so far.</summary>
        public long SamplesRead;

        /// <summary>Samples at <paramref name="rateHz"/> from <paramref name="clock"/>'s time.</summary>
        public HandAccelerometer(HandClock clock, int rateHz)
        {
            this.clock = clock;
            periodMicros = 1000000 / rateHz;
            OutputDataRateMilliHz = rateHz * 1000;
            nextSampleMicros = clock.Micros + periodMicros;
        }

        /// <inheritdoc/>
        public int OutputDataRateMilliHz { get; private set; }

        /// <inheritdoc/>
        public int FullScaleMilliG
        {
            get { return 8000; }
        }

        /// <inheritdoc/>
        public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
        {
            while (nextSampleMicros <= clock.Micros)
            {
                if (stored == Depth)
                {
                    overflowed = true;
                }
                else
                {
                    stored++;
                }

                nextSampleMicros += periodMicros;
            }

            fifoOverflowed = overflowed;
            overflowed = false;
            int take = stored < maxSamples ? stored : maxSamples;
            for (int i = 0; i < take; i++)
            {
                xyzMilliG[i * 3] = (short)ForwardMilliG;
                xyzMilliG[(i * 3) + 1] = 2;
                xyzMilliG[(i * 3) + 2] = 1000;
            }

            stored -= take;
            SamplesRead += take;
            return take;
        }
    }

    /// <summary>Keeps the CRC-32 and length of everything written, and counts the frames.</summary>
    public sealed class CrcSink : IByteSink
    {
        private uint register = Crc32.Seed;

        /// <summary>Bytes written.</summary>
        public long Bytes;

        /// <summary>Frames written (delimiters seen).</summary>
        public long Frames;

        /// <summary>The CRC-32 of every byte written so far.</summary>
        public uint Crc
        {
            get { return Crc32.Finish(register); }
        }

        /// <inheritdoc/>
        public bool Write(byte[] buffer, int offset, int count)
        {
            register = Crc32.Append(register, buffer, offset, count);
            Bytes += count;
            for (int i = offset; i < offset + count; i++)
            {
                if (buffer[i] == LogFormat.Delimiter)
                {
                    Frames++;
                }
            }

            return true;
        }
    }
}
