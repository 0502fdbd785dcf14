namespace LaunchLogger.Firmware.Wire
{
    /// <summary>Unsigned LEB128 varints and zig-zag signed varints (LOG-FORMAT.md, section 2).</summary>
    public static class Varint
    {
        /// <summary>The most bytes one 64-bit varint takes.</summary>
        public const int MaxBytes = 10;

        /// <summary>Writes <paramref name="value"/> at <paramref name="offset"/>; returns the bytes written.</summary>
        public static int Write(byte[] buffer, int offset, ulong value)
        {
            int start = offset;
            while (value >= 0x80)
            {
                buffer[offset++] = (byte)(value | 0x80);
                value >>= 7;
            }

            buffer[offset++] = (byte)value;
            return offset - start;
        }

        /// <summary>Writes a signed value zig-zag mapped; returns the bytes written.</summary>
        public static int WriteSigned(byte[] buffer, int offset, long value)
        {
            return Write(buffer, offset, ZigZag(value));
        }

        /// <summary>Maps a signed value so that small magnitudes give small unsigned values.</summary>
        public static ulong ZigZag(long value)
        {
            return (ulong)((value << 1) ^ (value >> 63));
        }

        /// <summary>Undoes <see cref="ZigZag"/>.</summary>
        public static long UnZigZag(ulong value)
        {
            return (long)(value >> 1) ^ -(long)(value & 1);
        }

        /// <summary>Reads a varint at <paramref name="offset"/>. Returns the bytes read, or 0 when
        /// the varint runs past <paramref name="end"/> or is longer than 64 bits allow.</summary>
        public static int Read(byte[] buffer, int offset, int end, out ulong value)
        {
            value = 0;
            int shift = 0;
            int i = offset;
            while (i < end && shift < 64)
            {
                byte b = buffer[i++];
                if (shift == 63 && b > 1)
                {
                    // The tenth group may hold only bit 63.
                    break;
                }

                value |= (ulong)(b & 0x7F) << shift;
                if ((b & 0x80) == 0)
                {
                    return i - offset;
                }

                shift += 7;
            }

            value = 0;
            return 0;
        }
    }
}
