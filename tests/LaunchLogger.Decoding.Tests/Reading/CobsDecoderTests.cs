using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reading;

public class CobsDecoderTests
{
    // Consistent Overhead Byte Stuffing (algorithm: Cheshire & Baker, SIGCOMM 1997 / IEEE/ACM
    // ToN 1999). The pairs are the widely copied COBS example table, not the paper's own figures
    // (which differ), each re-derived by hand from the algorithm; delimiter not shown. The same
    // table is checked against the firmware's encoder in
    // tests/LaunchLogger.Firmware.Tests/Reference/CobsExampleTableTests.cs.
    [Theory]
    [InlineData("one zero", "00", "01 01")]
    [InlineData("two zeros", "00 00", "01 01 01")]
    [InlineData("zero inside", "11 22 00 33", "03 11 22 02 33")]
    [InlineData("no zero", "11 22 33 44", "05 11 22 33 44")]
    [InlineData("trailing zeros", "11 00 00 00", "02 11 01 01 01")]
    public void PublishedExamplesDecode(string name, string payload, string stuffed)
    {
        byte[] expected = Convert.FromHexString(payload.Replace(" ", ""));
        var destination = new byte[64];

        Assert.True(CobsDecoder.TryDecode(Convert.FromHexString(stuffed.Replace(" ", "")), destination, out int written), name);
        Assert.Equal(expected, destination[..written]);
    }

    [Fact]
    public void FullBlockOf254NonZeroBytesDecodesInBothForms()
    {
        // 01…FE (254 bytes) → FF 01…FE (re-derived from the algorithm); the encoder listed in the
        // paper adds a trailing 01 (from memory), which the decoder accepts as well.
        byte[] payload = Enumerable.Range(1, 254).Select(i => (byte)i).ToArray();
        byte[] ours = [0xFF, .. payload];
        byte[] paper = [0xFF, .. payload, 0x01];
        var destination = new byte[300];

        Assert.True(CobsDecoder.TryDecode(ours, destination, out int a));
        Assert.Equal(payload, destination[..a]);
        Assert.True(CobsDecoder.TryDecode(paper, destination, out int b));
        Assert.Equal(payload, destination[..b]);
    }

    [Fact]
    public void RoundTripsTheFirmwareEncoder()
    {
        var random = new Random(12345);
        foreach (int length in new[] { 1, 2, 253, 254, 255, 508, 509, 1024 })
        {
            for (int zeros = 0; zeros <= 3; zeros++)
            {
                byte[] payload = new byte[length];
                random.NextBytes(payload);
                for (int i = 0; i < payload.Length; i++)
                {
                    // zeros = 0: none; otherwise roughly one byte in 4^zeros.
                    payload[i] = zeros == 0 ? (byte)Math.Max((int)payload[i], 1) : random.Next(1 << (2 * zeros)) == 0 ? (byte)0 : payload[i];
                }

                var stuffed = new byte[Cobs.MaxEncodedLength(length)];
                int n = Cobs.Encode(payload, 0, length, stuffed, 0);
                var decoded = new byte[length];

                Assert.True(CobsDecoder.TryDecode(stuffed.AsSpan(0, n), decoded, out int written));
                Assert.Equal(payload, decoded[..written]);
            }
        }
    }

    [Theory]
    [InlineData("zero inside", "03 11 00")]
    [InlineData("code runs past the end", "05 11 22")]
    public void BadStuffingIsRejected(string name, string stuffed)
    {
        Assert.False(CobsDecoder.TryDecode(Convert.FromHexString(stuffed.Replace(" ", "")), new byte[16], out _), name);
    }

    [Fact]
    public void PayloadLongerThanTheDestinationIsRejected()
    {
        Assert.False(CobsDecoder.TryDecode([0x05, 0x11, 0x22, 0x33, 0x44], new byte[3], out _));
        Assert.False(CobsDecoder.TryDecode([0x03, 0x11, 0x22, 0x02, 0x33], new byte[2], out _));
    }
}
