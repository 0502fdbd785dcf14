using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Reference;

/// <summary>Consistent Overhead Byte Stuffing against the worked examples of Cheshire &amp; Baker,
/// "Consistent Overhead Byte Stuffing" (SIGCOMM 1997; IEEE/ACM Transactions on Networking, 1999),
/// as listed in shared/REFERENCES.md. The delimiter is not part of these encodings.</summary>
public class CobsPaperTests
{
    public static TheoryData<string, string, string> Examples => new()
    {
        // name, payload, stuffed (Cheshire & Baker worked examples)
        { "one zero", "00", "01 01" },
        { "two zeros", "00 00", "01 01 01" },
        { "zero inside", "11 22 00 33", "03 11 22 02 33" },
        { "no zero", "11 22 33 44", "05 11 22 33 44" },
        { "trailing zeros", "11 00 00 00", "02 11 01 01 01" },
        { "254 non-zero bytes", Hex.Format(Hex.Run(0x01, 0xFE)), "FF" + Hex.Format(Hex.Run(0x01, 0xFE)) },
    };

    [Theory]
    [MemberData(nameof(Examples))]
    public void EncodesThePublishedExample(string name, string payloadHex, string stuffedHex)
    {
        byte[] payload = Hex.Parse(payloadHex);
        byte[] stuffed = new byte[Cobs.MaxEncodedLength(payload.Length)];
        int n = Cobs.Encode(payload, 0, payload.Length, stuffed, 0);
        Assert.True(Hex.Format(stuffed, 0, n) == Hex.Format(Hex.Parse(stuffedHex)), name);
    }

    [Theory]
    [MemberData(nameof(Examples))]
    public void DecodesThePublishedExample(string name, string payloadHex, string stuffedHex)
    {
        byte[] stuffed = Hex.Parse(stuffedHex);
        byte[] payload = new byte[stuffed.Length];
        int n = Cobs.Decode(stuffed, 0, stuffed.Length, payload, 0);
        Assert.True(n >= 0, name);
        Assert.Equal(Hex.Format(Hex.Parse(payloadHex)), Hex.Format(payload, 0, n));
    }

    [Fact]
    public void AcceptsThePapersTrailingCodeByteAfterAFullBlock()
    {
        // Cheshire & Baker's own encoder ends a payload of exactly 254 non-zero bytes with an extra 01
        // code byte; LOG-FORMAT.md section 1 says our decoder accepts that form too.
        byte[] stuffed = Hex.Parse("FF" + Hex.Format(Hex.Run(0x01, 0xFE)) + "01");
        byte[] payload = new byte[stuffed.Length];
        int n = Cobs.Decode(stuffed, 0, stuffed.Length, payload, 0);
        Assert.Equal(Hex.Format(Hex.Run(0x01, 0xFE)), Hex.Format(payload, 0, n));
    }
}
