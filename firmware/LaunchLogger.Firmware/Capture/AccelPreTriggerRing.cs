using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Capture
{
    /// <summary>Keeps the most recent accelerometer bursts before a run opens, so that first
    /// motion can be found even before the first pulse edge.</summary>
    /// <remarks>Samples live in one fixed ring; a second fixed ring remembers each burst's first
    /// sample index and read time, which the host needs to estimate the sensor's true period.
    /// When either ring is full the oldest samples go first.</remarks>
    public sealed class AccelPreTriggerRing
    {
        private readonly short[] samples;
        private readonly int sampleCapacity;
        private readonly long[] burstFirstIndex;
        private readonly long[] burstReadMicros;
        private readonly int[] burstCount;
        private readonly int[] burstStart;
        private readonly int burstCapacity;
        private int sampleHead;
        private int sampleTotal;
        private int burstOldest;
        private int burstTotal;

        /// <summary>Allocates the rings once.</summary>
        public AccelPreTriggerRing(int sampleCapacity, int burstCapacity)
        {
            this.sampleCapacity = sampleCapacity;
            this.burstCapacity = burstCapacity;
            samples = new short[sampleCapacity * 3];
            burstFirstIndex = new long[burstCapacity];
            burstReadMicros = new long[burstCapacity];
            burstCount = new int[burstCapacity];
            burstStart = new int[burstCapacity];
        }

        /// <summary>Samples held now.</summary>
        public int SampleCount
        {
            get { return sampleTotal; }
        }

        /// <summary>Adds a burst of <paramref name="count"/> x, y, z samples.</summary>
        public void Add(short[] xyzMilliG, int count, long firstIndex, long readMicros)
        {
            if (count <= 0)
            {
                return;
            }

            int skip = 0;
            if (count > sampleCapacity)
            {
                skip = count - sampleCapacity;
            }

            int keep = count - skip;
            if (burstTotal == burstCapacity)
            {
                DropOldestBurst();
            }

            while (sampleTotal + keep > sampleCapacity)
            {
                int excess = sampleTotal + keep - sampleCapacity;
                int oldestCount = burstCount[burstOldest];
                if (oldestCount <= excess)
                {
                    DropOldestBurst();
                }
                else
                {
                    burstCount[burstOldest] -= excess;
                    burstFirstIndex[burstOldest] += excess;
                    burstStart[burstOldest] = (burstStart[burstOldest] + excess) % sampleCapacity;
                    sampleTotal -= excess;
                }
            }

            int slot = (burstOldest + burstTotal) % burstCapacity;
            burstFirstIndex[slot] = firstIndex + skip;
            burstReadMicros[slot] = readMicros;
            burstCount[slot] = keep;
            burstStart[slot] = sampleHead;
            burstTotal++;
            for (int i = 0; i < keep; i++)
            {
                int src = (skip + i) * 3;
                int dst = sampleHead * 3;
                samples[dst] = xyzMilliG[src];
                samples[dst + 1] = xyzMilliG[src + 1];
                samples[dst + 2] = xyzMilliG[src + 2];
                sampleHead++;
                if (sampleHead == sampleCapacity)
                {
                    sampleHead = 0;
                }
            }

            sampleTotal += keep;
        }

        /// <summary>Writes the oldest samples, oldest burst first, as acceleration frames of at
        /// most <paramref name="maxSamplesPerFrame"/> samples (each with its burst's read time and
        /// first index), and removes them from the ring; stops once
        /// <paramref name="maxSamples"/> have been written.</summary>
        /// <returns>The number of samples written.</returns>
        public int WriteTo(FrameWriter writer, int maxSamplesPerFrame, int maxSamples)
        {
            int written = 0;
            while (burstTotal > 0 && written < maxSamples)
            {
                int slot = burstOldest;
                int count = burstCount[slot];
                int pos = burstStart[slot];
                int n = count < maxSamplesPerFrame ? count : maxSamplesPerFrame;
                if (n > maxSamples - written)
                {
                    n = maxSamples - written;
                }

                writer.Begin(FrameType.Acceleration);
                writer.PutVarint(burstReadMicros[slot]);
                writer.PutVarint(burstFirstIndex[slot]);
                writer.PutVarint(n);
                for (int i = 0; i < n; i++)
                {
                    int at = pos * 3;
                    writer.PutInt16(samples[at]);
                    writer.PutInt16(samples[at + 1]);
                    writer.PutInt16(samples[at + 2]);
                    pos++;
                    if (pos == sampleCapacity)
                    {
                        pos = 0;
                    }
                }

                writer.End();
                written += n;
                sampleTotal -= n;
                if (n == count)
                {
                    burstOldest = (burstOldest + 1) % burstCapacity;
                    burstTotal--;
                }
                else
                {
                    burstCount[slot] = count - n;
                    burstFirstIndex[slot] += n;
                    burstStart[slot] = pos;
                }
            }

            if (burstTotal == 0)
            {
                Clear();
            }

            return written;
        }

        /// <summary>Whether a burst of <paramref name="count"/> samples fits without dropping any
        /// older sample or burst.</summary>
        public bool HasRoomFor(int count)
        {
            int keep = count < sampleCapacity ? count : sampleCapacity;
            return burstTotal < burstCapacity && sampleTotal + keep <= sampleCapacity;
        }

        /// <summary>Forgets everything held.</summary>
        public void Clear()
        {
            sampleHead = 0;
            sampleTotal = 0;
            burstOldest = 0;
            burstTotal = 0;
        }

        private void DropOldestBurst()
        {
            sampleTotal -= burstCount[burstOldest];
            burstOldest = (burstOldest + 1) % burstCapacity;
            burstTotal--;
        }
    }
}
