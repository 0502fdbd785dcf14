using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Wire
{
    /// <summary>Builds one frame at a time into a preallocated payload buffer, then appends the
    /// CRC, stuffs it and hands it to the byte sink (LOG-FORMAT.md, section 1).</summary>
    /// <remarks>Allocates only in its constructor. Use it as Begin, Put…, End.</remarks>
    public sealed class FrameWriter
    {
        private readonly IByteSink sink;
        private readonly HealthCounters health;
        private readonly byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        private readonly byte[] encoded = new byte[LogFormat.MaxEncodedFrameBytes];
        private int length;
        private int sequence;
        private bool open;

        /// <summary>Creates a writer that sends finished frames to <paramref name="sink"/>.</summary>
        public FrameWriter(IByteSink sink, HealthCounters health)
        {
            if (sink == null)
            {
                throw new System.ArgumentNullException("sink");
            }

            this.sink = sink;
            this.health = health;
        }

        /// <summary>Frames finished since power-up (refused ones included).</summary>
        public long FramesWritten { get; private set; }

        /// <summary>Body bytes still free in the frame being built.</summary>
        public int Remaining
        {
            get { return LogFormat.MaxPayloadBytes - LogFormat.CrcBytes - length; }
        }

        /// <summary>Starts a frame: type byte and the next sequence number.</summary>
        public void Begin(FrameType type)
        {
            if (open)
            {
                throw new System.InvalidOperationException("Begin called twice without End");
            }

            open = true;
            payload[0] = (byte)type;
            payload[1] = (byte)sequence;
            payload[2] = (byte)(sequence >> 8);
            length = LogFormat.HeaderBytes;
        }

        /// <summary>Appends one byte to the body.</summary>
        public void PutByte(byte value)
        {
            Reserve(1);
            payload[length++] = value;
        }

        /// <summary>Appends a little-endian 16-bit integer.</summary>
        public void PutInt16(short value)
        {
            Reserve(2);
            payload[length++] = (byte)value;
            payload[length++] = (byte)(value >> 8);
        }

        /// <summary>Appends an unsigned varint; a negative value is a caller bug.</summary>
        public void PutVarint(long value)
        {
            if (value < 0)
            {
                throw new System.ArgumentOutOfRangeException("value", "varint fields are never negative");
            }

            Reserve(Varint.MaxBytes);
            length += Varint.Write(payload, length, (ulong)value);
        }

        /// <summary>Appends a zig-zag signed varint.</summary>
        public void PutSignedVarint(long value)
        {
            Reserve(Varint.MaxBytes);
            length += Varint.WriteSigned(payload, length, value);
        }

        /// <summary>Appends bytes prepared elsewhere (a pulse batch's body).</summary>
        public void PutBytes(byte[] source, int offset, int count)
        {
            Reserve(count);
            System.Array.Copy(source, offset, payload, length, count);
            length += count;
        }

        /// <summary>Finishes the frame: CRC, stuffing, delimiter, and hands it to the sink.</summary>
        /// <returns>False when the sink refused the bytes (counted in the health counters).</returns>
        public bool End()
        {
            if (!open)
            {
                throw new System.InvalidOperationException("End called without Begin");
            }

            uint crc = Crc32.Compute(payload, 0, length);
            payload[length++] = (byte)crc;
            payload[length++] = (byte)(crc >> 8);
            payload[length++] = (byte)(crc >> 16);
            payload[length++] = (byte)(crc >> 24);
            int n = Cobs.Encode(payload, 0, length, encoded, 0);
            encoded[n++] = LogFormat.Delimiter;
            open = false;
            sequence = (sequence + 1) & 0xFFFF;
            FramesWritten++;
            bool accepted = sink.Write(encoded, 0, n);
            if (!accepted && health != null)
            {
                health.FramesRefused++;
            }

            return accepted;
        }

        private void Reserve(int count)
        {
            if (!open)
            {
                throw new System.InvalidOperationException("Put called outside Begin/End");
            }

            if (length + count > LogFormat.MaxPayloadBytes - LogFormat.CrcBytes)
            {
                throw new System.InvalidOperationException("frame body too long");
            }
        }
    }
}
