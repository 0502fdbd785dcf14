using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Wire
{
    /// <summary>Builds one frame at a time and hands it to the byte sink (LOG-FORMAT.md,
    /// section 1). Every byte is folded into the CRC and stuffed (COBS) as it is appended, so
    /// finishing a frame costs only its four CRC bytes and the delimiter: no pass over the
    /// whole frame stalls the capture loop.</summary>
    /// <remarks>Allocates only in its constructor. Use it as Begin, Put…, End. The bytes are
    /// those of <see cref="Crc32.Compute"/> and <see cref="Cobs.Encode"/> over the finished
    /// payload.</remarks>
    public sealed class FrameWriter
    {
        // 16-bit values packed per pass of the stuffing loop by PutInt16s.
        private const int PackedShorts = 48;

        private readonly IByteSink sink;
        private readonly HealthCounters health;
        private readonly byte[] encoded = new byte[LogFormat.MaxEncodedFrameBytes];
        private readonly byte[] scratch = new byte[Varint.MaxBytes];
        private readonly byte[] delimiter = new byte[] { LogFormat.Delimiter };
        private readonly byte[] packed = new byte[2 * PackedShorts];
        private readonly uint[] crcTable = Crc32.SharedTable;
        private int length;
        private int sequence;
        private bool open;

        // The running CRC register and the stuffing state: where the open block's code byte
        // goes, where the next byte goes, the open block's code, and whether the last byte
        // closed a full 254-byte block (then no further code byte is written at the end).
        private uint crc;
        private int codeAt;
        private int write;
        private byte code;
        private bool lastBlockFull;

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

        /// <summary>Writes a lone delimiter: it ends whatever a power cut left unfinished at the
        /// end of the log (LOG-FORMAT.md, 0x07), so the next frame cannot be read as its tail.</summary>
        /// <returns>False when the sink refused the byte.</returns>
        public bool WriteDelimiter()
        {
            if (open)
            {
                throw new System.InvalidOperationException("a delimiter cannot go inside a frame");
            }

            return sink.Write(delimiter, 0, 1);
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
            crc = Crc32.Seed;
            codeAt = 0;
            write = 1;
            code = 1;
            lastBlockFull = false;
            length = 0;
            scratch[0] = (byte)type;
            scratch[1] = (byte)sequence;
            scratch[2] = (byte)(sequence >> 8);
            Append(scratch, 0, LogFormat.HeaderBytes, true);
        }

        /// <summary>Appends one byte to the body.</summary>
        public void PutByte(byte value)
        {
            Reserve(1);
            scratch[0] = value;
            Append(scratch, 0, 1, true);
        }

        /// <summary>Appends a little-endian 16-bit integer.</summary>
        public void PutInt16(short value)
        {
            Reserve(2);
            scratch[0] = (byte)value;
            scratch[1] = (byte)(value >> 8);
            Append(scratch, 0, 2, true);
        }

        /// <summary>Appends <paramref name="count"/> little-endian 16-bit integers from
        /// <paramref name="values"/>: the same bytes as as many <see cref="PutInt16"/> calls, with
        /// the per-call work paid once per 48 values.</summary>
        public void PutInt16s(short[] values, int offset, int count)
        {
            Reserve(2 * count);
            byte[] buffer = packed;
            int done = 0;
            while (done < count)
            {
                int n = count - done;
                if (n > PackedShorts)
                {
                    n = PackedShorts;
                }

                int from = offset + done;
                for (int k = 0; k < n; k++)
                {
                    short value = values[from + k];
                    buffer[2 * k] = (byte)value;
                    buffer[(2 * k) + 1] = (byte)(value >> 8);
                }

                Append(buffer, 0, 2 * n, true);
                done += n;
            }
        }

        /// <summary>Appends an unsigned varint; a negative value is a caller bug.</summary>
        public void PutVarint(long value)
        {
            if (value < 0)
            {
                throw new System.ArgumentOutOfRangeException("value", "varint fields are never negative");
            }

            Reserve(Varint.MaxBytes);
            Append(scratch, 0, Varint.Write(scratch, 0, (ulong)value), true);
        }

        /// <summary>Appends a zig-zag signed varint.</summary>
        public void PutSignedVarint(long value)
        {
            Reserve(Varint.MaxBytes);
            Append(scratch, 0, Varint.WriteSigned(scratch, 0, value), true);
        }

        /// <summary>Appends bytes prepared elsewhere (a pulse batch's body).</summary>
        public void PutBytes(byte[] source, int offset, int count)
        {
            Reserve(count);
            Append(source, offset, count, true);
        }

        /// <summary>Finishes the frame: CRC, last code byte, delimiter, and hands it to the sink.</summary>
        /// <returns>False when the sink refused the bytes (counted in the health counters).</returns>
        public bool End()
        {
            if (!open)
            {
                throw new System.InvalidOperationException("End called without Begin");
            }

            uint value = Crc32.Finish(crc);
            scratch[0] = (byte)value;
            scratch[1] = (byte)(value >> 8);
            scratch[2] = (byte)(value >> 16);
            scratch[3] = (byte)(value >> 24);
            Append(scratch, 0, LogFormat.CrcBytes, false);
            if (lastBlockFull)
            {
                // The payload ended right after a full block: the slot kept for a next code
                // byte is not written (Cobs.Encode's rule).
                write--;
            }
            else
            {
                encoded[codeAt] = code;
            }

            int n = write;
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

        /// <summary>Folds bytes into the CRC (when <paramref name="checksummed"/>) and stuffs them
        /// into the encoded frame.</summary>
        private void Append(byte[] source, int offset, int count, bool checksummed)
        {
            // One pass per byte for both the CRC (Crc32.Append's step, inlined) and the stuffing,
            // on locals: the interpreter spends two instructions on every field access.
            uint[] table = crcTable;
            uint register = crc;
            byte[] output = encoded;
            int at = write;
            int slot = codeAt;
            int run = code;
            bool full = lastBlockFull;
            int end = offset + count;
            for (int i = offset; i < end; i++)
            {
                byte b = source[i];
                if (checksummed)
                {
                    register = table[(register ^ b) & 0xFF] ^ (register >> 8);
                }

                full = false;
                if (b == 0)
                {
                    output[slot] = (byte)run;
                    slot = at++;
                    run = 1;
                    continue;
                }

                output[at++] = b;
                run++;
                if (run == 0xFF)
                {
                    output[slot] = 0xFF;
                    run = 1;
                    slot = at++;
                    full = true;
                }
            }

            write = at;
            codeAt = slot;
            code = (byte)run;
            lastBlockFull = full;
            crc = register;
            length += count;
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
