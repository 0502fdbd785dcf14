namespace LaunchLogger.Firmware.Wire
{
    /// <summary>CRC-32 as used on every log frame.</summary>
    /// <remarks>
    /// Variant CRC-32/ISO-HDLC (the catalogue name; also called CRC-32/ADCCP, the Ethernet and
    /// zip CRC): polynomial 0x04C11DB7 (reflected 0xEDB88320), initial value 0xFFFFFFFF, input
    /// and output reflected, final XOR 0xFFFFFFFF. Check value for the ASCII bytes "123456789"
    /// is 0xCBF43926. On the wire the 32-bit value is written little-endian. Table driven; the
    /// table is built once, so computing a CRC allocates nothing.
    /// </remarks>
    public static class Crc32
    {
        private static readonly uint[] Table = BuildTable();

        /// <summary>The 256-entry table of the reflected polynomial, for a caller that folds bytes
        /// in its own loop (the frame writer, which stuffs each byte in the same pass): the
        /// register steps as <c>r = table[(r ^ b) &amp; 0xFF] ^ (r &gt;&gt; 8)</c>, as in
        /// <see cref="Append"/>. Do not write to it.</summary>
        internal static uint[] SharedTable
        {
            get { return Table; }
        }

        /// <summary>The register value to start an incremental computation with.</summary>
        public const uint Seed = 0xFFFFFFFFu;

        /// <summary>Computes the CRC of <paramref name="count"/> bytes in one call.</summary>
        public static uint Compute(byte[] data, int offset, int count)
        {
            return Finish(Append(Seed, data, offset, count));
        }

        /// <summary>Feeds bytes into a running register (start with <see cref="Seed"/>).</summary>
        public static uint Append(uint register, byte[] data, int offset, int count)
        {
            uint[] table = Table;
            int end = offset + count;
            for (int i = offset; i < end; i++)
            {
                register = table[(register ^ data[i]) & 0xFF] ^ (register >> 8);
            }

            return register;
        }

        /// <summary>Turns a running register into the CRC value (applies the final XOR).</summary>
        public static uint Finish(uint register)
        {
            return register ^ 0xFFFFFFFFu;
        }

        private static uint[] BuildTable()
        {
            uint[] table = new uint[256];
            for (uint n = 0; n < 256; n++)
            {
                uint c = n;
                for (int k = 0; k < 8; k++)
                {
                    c = (c & 1) != 0 ? 0xEDB88320u ^ (c >> 1) : c >> 1;
                }

                table[n] = c;
            }

            return table;
        }
    }
}
