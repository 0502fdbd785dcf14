using System.Text;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Reference;

/// <summary>The frame CRC against the catalogue of parametrised CRC algorithms (entry
/// CRC-32/ISO-HDLC) and against System.IO.Hashing.Crc32, the reference library.</summary>
public class Crc32CatalogueTests
{
    [Fact]
    public void CheckValueOfTheAsciiDigits()
    {
        // Catalogue of parametrised CRC algorithms, CRC-32/ISO-HDLC: check = 0xCBF43926 for "123456789".
        byte[] data = Encoding.ASCII.GetBytes("123456789");
        Assert.Equal(0xCBF43926u, Crc32.Compute(data, 0, data.Length));
    }

    [Fact]
    public void FourZeroBytes()
    {
        // CRC-32/ISO-HDLC of 00 00 00 00 = 0x2144DF1C (shared/REFERENCES.md, "Checksums and framing").
        Assert.Equal(0x2144DF1Cu, Crc32.Compute(new byte[4], 0, 4));
    }

    [Fact]
    public void ResidueAfterAMessageAndItsOwnCrc()
    {
        // Catalogue of parametrised CRC algorithms, CRC-32/ISO-HDLC: residue = 0xDEBB20E3, the register
        // after an error-free codeword (message + CRC little-endian), before the final XOR.
        byte[] message = Encoding.ASCII.GetBytes("123456789");
        uint crc = Crc32.Compute(message, 0, message.Length);
        byte[] codeword = message.Concat(BitConverter.GetBytes(crc)).ToArray();
        Assert.True(BitConverter.IsLittleEndian);
        Assert.Equal(0xDEBB20E3u, Crc32.Append(Crc32.Seed, codeword, 0, codeword.Length));
    }

    [Fact]
    public void EqualsSystemIoHashingOnRandomDataOfManyLengths()
    {
        // Reference library: System.IO.Hashing.Crc32 (NuGet System.IO.Hashing) implements CRC-32/ISO-HDLC.
        var random = new Random(20261201);
        for (int length = 0; length <= 1100; length += length < 64 ? 1 : 37)
        {
            byte[] data = new byte[length + 10];
            random.NextBytes(data);
            int offset = random.Next(0, 10);
            uint expected = System.IO.Hashing.Crc32.HashToUInt32(data.AsSpan(offset, length));
            Assert.Equal(expected, Crc32.Compute(data, offset, length));
        }
    }
}
