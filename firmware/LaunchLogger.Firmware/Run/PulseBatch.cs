using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Run
{
    /// <summary>Collects the observations of one channel into the body of a pulses frame, coded
    /// as deltas (LOG-FORMAT.md, frame 0x02), until it is full or old enough to write.</summary>
    internal sealed class PulseBatch
    {
        private const int MaxObservationBytes = 3 * Varint.MaxBytes;
        private readonly byte[] body;
        private readonly int limit;
        private readonly int channel;
        private int length;
        private int observations;
        private long lastCount;
        private long lastHiMicros;
        private long firstHiMicros;

        /// <param name="channel">The pulse channel.</param>
        /// <param name="maxBodyBytes">Most body bytes per frame; 0 for as many as a frame holds.</param>
        internal PulseBatch(int channel, int maxBodyBytes)
        {
            this.channel = channel;

            // Room for the body inside one payload: header, channel, count varint and CRC aside.
            body = new byte[LogFormat.MaxPayloadBytes - LogFormat.MinPayloadBytes - 1 - Varint.MaxBytes];
            limit = maxBodyBytes > 0 && maxBodyBytes < body.Length ? maxBodyBytes : body.Length;
        }

        internal bool IsEmpty
        {
            get { return observations == 0; }
        }

        internal long FirstHiMicros
        {
            get { return firstHiMicros; }
        }

        internal bool IsFull
        {
            get { return length + MaxObservationBytes > limit; }
        }

        /// <summary>Adds an observation; counts are relative to the run's origin.</summary>
        internal void Add(long count, long loMicros, long hiMicros)
        {
            if (observations == 0)
            {
                length += Varint.Write(body, length, (ulong)count);
                length += Varint.Write(body, length, (ulong)loMicros);
                firstHiMicros = hiMicros;
            }
            else
            {
                length += Varint.Write(body, length, (ulong)(count - lastCount));
                length += Varint.WriteSigned(body, length, loMicros - lastHiMicros);
            }

            length += Varint.Write(body, length, (ulong)(hiMicros - loMicros));
            lastCount = count;
            lastHiMicros = hiMicros;
            observations++;
        }

        /// <summary>Writes the batch as one frame (if it holds anything) and empties it.</summary>
        internal void Flush(FrameWriter writer)
        {
            if (observations == 0)
            {
                return;
            }

            writer.Begin(FrameType.Pulses);
            writer.PutByte((byte)channel);
            writer.PutVarint(observations);
            writer.PutBytes(body, 0, length);
            writer.End();
            Reset();
        }

        internal void Reset()
        {
            length = 0;
            observations = 0;
        }
    }
}
