namespace LaunchLogger.Firmware.Wire
{
    /// <summary>Consistent Overhead Byte Stuffing (Cheshire &amp; Baker, 1997).</summary>
    /// <remarks>
    /// Removes every zero from a payload so that a single zero byte can delimit frames. A block
    /// of 254 non-zero bytes is coded <c>FF</c> + the bytes with no implied zero; when the payload
    /// ends exactly after such a block no trailing <c>01</c> is written (LOG-FORMAT.md, section 1).
    /// The delimiter itself is not written here.
    /// </remarks>
    public static class Cobs
    {
        /// <summary>The most bytes <see cref="Encode"/> can write for a payload of the given length.</summary>
        public static int MaxEncodedLength(int payloadLength)
        {
            return payloadLength + (payloadLength / 254) + 1;
        }

        /// <summary>Stuffs <paramref name="count"/> bytes of <paramref name="source"/> into
        /// <paramref name="destination"/> at <paramref name="destinationOffset"/>.</summary>
        /// <returns>The number of bytes written (never a zero among them).</returns>
        public static int Encode(byte[] source, int offset, int count, byte[] destination, int destinationOffset)
        {
            int codeAt = destinationOffset;
            int write = destinationOffset + 1;
            byte code = 1;
            int end = offset + count;
            for (int i = offset; i < end; i++)
            {
                byte b = source[i];
                if (b == 0)
                {
                    destination[codeAt] = code;
                    codeAt = write++;
                    code = 1;
                    continue;
                }

                destination[write++] = b;
                code++;
                if (code == 0xFF)
                {
                    destination[codeAt] = code;
                    code = 1;
                    if (i + 1 == end)
                    {
                        // The payload ends right after a full block: no trailing code byte.
                        return write - destinationOffset;
                    }

                    codeAt = write++;
                }
            }

            destination[codeAt] = code;
            return write - destinationOffset;
        }

        /// <summary>Undoes <see cref="Encode"/>. Returns the payload length, or -1 when the input
        /// holds a zero or a code byte that runs past its end.</summary>
        public static int Decode(byte[] source, int offset, int count, byte[] destination, int destinationOffset)
        {
            int read = offset;
            int end = offset + count;
            int write = destinationOffset;
            while (read < end)
            {
                int code = source[read++];
                if (code == 0)
                {
                    return -1;
                }

                int blockEnd = read + code - 1;
                if (blockEnd > end)
                {
                    return -1;
                }

                while (read < blockEnd)
                {
                    byte b = source[read++];
                    if (b == 0)
                    {
                        return -1;
                    }

                    destination[write++] = b;
                }

                if (code != 0xFF && read < end)
                {
                    destination[write++] = 0;
                }
            }

            return write - destinationOffset;
        }
    }
}
