using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Wire;

public class VarintTests
{
    [Theory]
    [InlineData(128UL)]
    [InlineData(300UL)]
    [InlineData(1_000_000UL)]
    [InlineData(ulong.MaxValue)]
    public void EveryTruncationReturnsZero(ulong value)
    {
        byte[] buffer = new byte[Varint.MaxBytes];
        int n = Varint.Write(buffer, 0, value);
        for (int cut = 0; cut < n; cut++)
        {
            Assert.Equal(0, Varint.Read(buffer, 0, cut, out ulong partial));
            Assert.Equal(0UL, partial);
        }

        Assert.Equal(n, Varint.Read(buffer, 0, n, out ulong whole));
        Assert.Equal(value, whole);
    }

    [Fact]
    public void MoreThanTenBytesIsRejected()
    {
        byte[] overlong = Hex.Parse("80 80 80 80 80 80 80 80 80 80 00");
        Assert.Equal(0, Varint.Read(overlong, 0, overlong.Length, out _));
    }

    [Theory]
    [InlineData("FF FF FF FF FF FF FF FF FF 02")]
    [InlineData("FF FF FF FF FF FF FF FF FF 7F")]
    [InlineData("80 80 80 80 80 80 80 80 80 03")]
    public void ATenthByteWithBitsBeyond64IsRejected(string hex)
    {
        // The tenth group holds bit 63 only; anything above would be silently cut off.
        byte[] data = Hex.Parse(hex);
        Assert.Equal(0, Varint.Read(data, 0, data.Length, out ulong value));
        Assert.Equal(0UL, value);
    }

    [Fact]
    public void ReadStopsAtTheFirstCompleteVarintAndHonoursOffset()
    {
        byte[] data = Hex.Parse("EE AC 02 05");
        Assert.Equal(2, Varint.Read(data, 1, data.Length, out ulong value));
        Assert.Equal(300UL, value);
        Assert.Equal(1, Varint.Read(data, 3, data.Length, out value));
        Assert.Equal(5UL, value);
    }

    [Fact]
    public void RandomValuesRoundTripSignedAndUnsigned()
    {
        var random = new Random(42);
        byte[] buffer = new byte[Varint.MaxBytes + 3];
        for (int i = 0; i < 20000; i++)
        {
            long value = random.NextInt64(long.MinValue, long.MaxValue) >> random.Next(0, 64);
            int n = Varint.WriteSigned(buffer, 3, value);
            Assert.InRange(n, 1, Varint.MaxBytes);
            Assert.Equal(n, Varint.Read(buffer, 3, 3 + n, out ulong raw));
            Assert.Equal(value, Varint.UnZigZag(raw));

            ulong unsigned = unchecked((ulong)value);
            n = Varint.Write(buffer, 0, unsigned);
            Assert.Equal(n, Varint.Read(buffer, 0, n, out ulong back));
            Assert.Equal(unsigned, back);
        }
    }

    [Fact]
    public void ZigZagExtremesRoundTrip()
    {
        Assert.Equal(long.MinValue, Varint.UnZigZag(Varint.ZigZag(long.MinValue)));
        Assert.Equal(long.MaxValue, Varint.UnZigZag(Varint.ZigZag(long.MaxValue)));
    }
}
