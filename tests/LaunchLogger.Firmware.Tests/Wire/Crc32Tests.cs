using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Wire;

public class Crc32Tests
{
    [Fact]
    public void IncrementalAppendFinishEqualsOneShotAtEverySplit()
    {
        var random = new Random(7);
        byte[] data = new byte[300];
        random.NextBytes(data);
        uint oneShot = Crc32.Compute(data, 0, data.Length);
        for (int split = 0; split <= data.Length; split++)
        {
            uint register = Crc32.Append(Crc32.Seed, data, 0, split);
            register = Crc32.Append(register, data, split, data.Length - split);
            Assert.Equal(oneShot, Crc32.Finish(register));
        }
    }

    [Fact]
    public void ManySmallAppendsEqualOneShot()
    {
        var random = new Random(8);
        byte[] data = new byte[1000];
        random.NextBytes(data);
        uint register = Crc32.Seed;
        int at = 0;
        while (at < data.Length)
        {
            int n = Math.Min(random.Next(0, 17), data.Length - at);
            register = Crc32.Append(register, data, at, n);
            at += n;
        }

        Assert.Equal(Crc32.Compute(data, 0, data.Length), Crc32.Finish(register));
    }

    [Fact]
    public void EmptyInputGivesZero()
    {
        // Init 0xFFFFFFFF and final XOR 0xFFFFFFFF cancel on an empty message (CRC-32/ISO-HDLC parameters).
        Assert.Equal(0u, Crc32.Compute(Array.Empty<byte>(), 0, 0));
    }

    [Fact]
    public void EverySingleBitErrorInAFrameIsDetected()
    {
        // A CRC whose generator has more than one term detects every single-bit error (from memory;
        // it follows from x^i never being divisible by such a generator).
        byte[] payload = { 0x04, 0x05, 0x00, 0x07, 0xC0, 0x84, 0x3D };
        uint good = Crc32.Compute(payload, 0, payload.Length);
        for (int bit = 0; bit < payload.Length * 8; bit++)
        {
            payload[bit / 8] ^= (byte)(1 << (bit % 8));
            Assert.NotEqual(good, Crc32.Compute(payload, 0, payload.Length));
            payload[bit / 8] ^= (byte)(1 << (bit % 8));
        }
    }
}
