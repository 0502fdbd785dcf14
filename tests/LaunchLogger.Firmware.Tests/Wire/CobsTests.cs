using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Wire;

public class CobsTests
{
    public static TheoryData<string, string, string> BlockEdges => new()
    {
        // Derived by hand from the encoding rule (a code byte = 1 + the non-zero bytes that follow,
        // FF = 254 bytes with no implied zero); the same cases as the COBS examples in common use.
        { "253 non-zero bytes", Hex.Format(Hex.Run(0x01, 0xFD)), "FE" + Hex.Format(Hex.Run(0x01, 0xFD)) },
        { "255 non-zero bytes", Hex.Format(Hex.Run(0x01, 0xFF)), "FF" + Hex.Format(Hex.Run(0x01, 0xFE)) + "02 FF" },
        { "254 non-zero then zero", Hex.Format(Hex.Run(0x02, 0xFF)) + "00", "FF" + Hex.Format(Hex.Run(0x02, 0xFF)) + "01 01" },
        { "253 non-zero, zero, one", Hex.Format(Hex.Run(0x03, 0xFF)) + "00 01", "FE" + Hex.Format(Hex.Run(0x03, 0xFF)) + "02 01" },
        { "254 non-zero, zero, 11", Hex.Format(Hex.Run(0x01, 0xFE)) + "00 11", "FF" + Hex.Format(Hex.Run(0x01, 0xFE)) + "01 02 11" },
        { "508 non-zero bytes", Hex.Format(Hex.Run(0x01, 0xFE)) + Hex.Format(Hex.Run(0x01, 0xFE)), "FF" + Hex.Format(Hex.Run(0x01, 0xFE)) + "FF" + Hex.Format(Hex.Run(0x01, 0xFE)) },
        { "empty", string.Empty, "01" },
    };

    [Theory]
    [MemberData(nameof(BlockEdges))]
    public void EncodesAndDecodesTheBlockEdges(string name, string payloadHex, string stuffedHex)
    {
        byte[] payload = Hex.Parse(payloadHex);
        byte[] stuffed = new byte[Cobs.MaxEncodedLength(payload.Length)];
        int n = Cobs.Encode(payload, 0, payload.Length, stuffed, 0);
        Assert.True(Hex.Format(Hex.Parse(stuffedHex)) == Hex.Format(stuffed, 0, n), name);

        byte[] back = new byte[n];
        int m = Cobs.Decode(stuffed, 0, n, back, 0);
        Assert.Equal(payloadHex.Replace(" ", string.Empty), Hex.Format(back, 0, m));
    }

    [Fact]
    public void RandomPayloadsWithZerosRoundTripAndNeverStuffAZero()
    {
        var random = new Random(1997);
        for (int trial = 0; trial < 2000; trial++)
        {
            int length = random.Next(0, 1100);
            byte[] payload = new byte[length];
            random.NextBytes(payload);
            int zeroOdds = random.Next(1, 300);
            for (int i = 0; i < length; i++)
            {
                if (random.Next(zeroOdds) == 0)
                {
                    payload[i] = 0;
                }
            }

            int at = random.Next(0, 5);
            byte[] stuffed = new byte[at + Cobs.MaxEncodedLength(length) + 5];
            int n = Cobs.Encode(payload, 0, length, stuffed, at);
            Assert.InRange(n, 1, Cobs.MaxEncodedLength(length));
            Assert.True(stuffed.AsSpan(at, n).IndexOf((byte)0) < 0, "a stuffed frame never contains the delimiter");

            byte[] back = new byte[length + 1];
            Assert.Equal(length, Cobs.Decode(stuffed, at, n, back, 0));
            Assert.True(payload.AsSpan().SequenceEqual(back.AsSpan(0, length)), $"round trip of {length} bytes");
        }
    }

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(253)]
    [InlineData(254)]
    [InlineData(255)]
    [InlineData(508)]
    [InlineData(1024)]
    public void MaxEncodedLengthHoldsForTheWorstCases(int length)
    {
        byte[] nonZero = Enumerable.Repeat((byte)0xAA, length).ToArray();
        byte[] zeros = new byte[length];
        byte[] stuffed = new byte[length * 2 + 2];
        Assert.True(Cobs.Encode(nonZero, 0, length, stuffed, 0) <= Cobs.MaxEncodedLength(length));
        Assert.True(Cobs.Encode(zeros, 0, length, stuffed, 0) <= Cobs.MaxEncodedLength(length));
    }

    [Fact]
    public void TheLargestFrameFitsTheWritersBuffer()
    {
        // Stuffed payload plus the delimiter.
        Assert.True(Cobs.MaxEncodedLength(LogFormat.MaxPayloadBytes) + 1 <= LogFormat.MaxEncodedFrameBytes);
    }

    [Theory]
    [InlineData("code runs past the end", "03 11")]
    [InlineData("code runs past the end after a block", "02 11 05 22 33")]
    [InlineData("full block cut short", "FF 01 02")]
    [InlineData("zero code byte", "00")]
    [InlineData("zero inside a block", "03 11 00")]
    [InlineData("zero code after a block", "02 11 00 22")]
    public void RejectsMalformedInput(string name, string stuffedHex)
    {
        byte[] stuffed = Hex.Parse(stuffedHex);
        byte[] payload = new byte[stuffed.Length + 1];
        Assert.True(Cobs.Decode(stuffed, 0, stuffed.Length, payload, 0) == -1, name);
    }

    [Fact]
    public void DecodeRespectsOffsetAndCount()
    {
        byte[] buffer = Hex.Parse("EE EE 03 11 22 02 33 EE");
        byte[] payload = new byte[10];
        int n = Cobs.Decode(buffer, 2, 5, payload, 3);
        Assert.Equal("11220033", Hex.Format(payload, 3, n));
    }
}
