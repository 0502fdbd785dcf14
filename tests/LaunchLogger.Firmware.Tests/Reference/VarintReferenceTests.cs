using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Reference;

/// <summary>Varints against the published LEB128 and zig-zag examples and against the .NET class
/// library's own 7-bit encoder (BinaryWriter.Write7BitEncodedInt64), which writes the same unsigned
/// LEB128 form.</summary>
public class VarintReferenceTests
{
    public static TheoryData<string, ulong, string> UnsignedExamples => new()
    {
        // DWARF Debugging Information Format, version 4, section 7.6, examples of unsigned LEB128.
        { "DWARF 2", 2, "02" },
        { "DWARF 127", 127, "7F" },
        { "DWARF 128", 128, "80 01" },
        { "DWARF 129", 129, "81 01" },
        { "DWARF 130", 130, "82 01" },
        { "DWARF 12857", 12857, "B9 64" },

        // Protocol Buffers encoding guide, "Base 128 Varints": 150 → 96 01.
        { "protobuf 150", 150, "96 01" },

        // LOG-FORMAT.md section 2 examples (re-derived: 300 = 0b10_0101100 → AC 02).
        { "zero", 0, "00" },
        { "300", 300, "AC 02" },

        // 64 one-bits need ceil(64 / 7) = 10 groups; the last carries the single top bit.
        { "ulong max", ulong.MaxValue, "FF FF FF FF FF FF FF FF FF 01" },
    };

    [Theory]
    [MemberData(nameof(UnsignedExamples))]
    public void UnsignedLeb128Examples(string name, ulong value, string expectedHex)
    {
        byte[] buffer = new byte[Varint.MaxBytes];
        int n = Varint.Write(buffer, 0, value);
        Assert.True(Hex.Format(Hex.Parse(expectedHex)) == Hex.Format(buffer, 0, n), name);

        Assert.Equal(n, Varint.Read(buffer, 0, n, out ulong back));
        Assert.Equal(value, back);
    }

    public static TheoryData<long, ulong> ZigZagExamples => new()
    {
        // Protocol Buffers encoding guide, "Signed Integers" (ZigZag table).
        { 0, 0 },
        { -1, 1 },
        { 1, 2 },
        { -2, 3 },
        { 2147483647, 4294967294 },
        { -2147483648, 4294967295 },

        // The same rule at 64 bits: (n << 1) ^ (n >> 63).
        { long.MaxValue, ulong.MaxValue - 1 },
        { long.MinValue, ulong.MaxValue },
    };

    [Theory]
    [MemberData(nameof(ZigZagExamples))]
    public void ZigZagExamplesMapBothWays(long signed, ulong mapped)
    {
        Assert.Equal(mapped, Varint.ZigZag(signed));
        Assert.Equal(signed, Varint.UnZigZag(mapped));

        byte[] buffer = new byte[Varint.MaxBytes];
        int n = Varint.WriteSigned(buffer, 0, signed);
        Assert.Equal(n, Varint.Read(buffer, 0, buffer.Length, out ulong raw));
        Assert.Equal(signed, Varint.UnZigZag(raw));
    }

    [Fact]
    public void SameBytesAsTheClassLibrarysSevenBitEncoder()
    {
        // Reference: System.IO.BinaryWriter.Write7BitEncodedInt64 writes a value 7 bits at a time, low
        // group first, high bit = more follows (unsigned LEB128 of the value's 64 bits).
        var random = new Random(128);
        byte[] buffer = new byte[Varint.MaxBytes];
        for (int i = 0; i < 5000; i++)
        {
            long value = random.NextInt64() >> random.Next(0, 64);
            if (i % 7 == 0)
            {
                value = -value;
            }

            using var stream = new MemoryStream();
            using (var bw = new BinaryWriter(stream, System.Text.Encoding.UTF8, leaveOpen: true))
            {
                bw.Write7BitEncodedInt64(value);
            }

            int n = Varint.Write(buffer, 0, unchecked((ulong)value));
            Assert.Equal(Hex.Format(stream.ToArray()), Hex.Format(buffer, 0, n));

            stream.Position = 0;
            using var br = new BinaryReader(stream);
            Assert.Equal(n, Varint.Read(buffer, 0, n, out ulong back));
            Assert.Equal(br.Read7BitEncodedInt64(), unchecked((long)back));
        }
    }
}
