using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reading;

/// <summary>Writes frame bodies field by field with the firmware's varint coder.</summary>
internal sealed class BodyBuilder
{
    private readonly List<byte> bytes = [];

    public BodyBuilder Byte(int value)
    {
        bytes.Add((byte)value);
        return this;
    }

    public BodyBuilder Varint(long value)
    {
        var buffer = new byte[Firmware.Wire.Varint.MaxBytes];
        int n = Firmware.Wire.Varint.Write(buffer, 0, (ulong)value);
        bytes.AddRange(buffer[..n]);
        return this;
    }

    public BodyBuilder Svarint(long value)
    {
        var buffer = new byte[Firmware.Wire.Varint.MaxBytes];
        int n = Firmware.Wire.Varint.WriteSigned(buffer, 0, value);
        bytes.AddRange(buffer[..n]);
        return this;
    }

    public BodyBuilder Int16(short value)
    {
        bytes.Add((byte)value);
        bytes.Add((byte)(value >> 8));
        return this;
    }

    public byte[] ToArray() => bytes.ToArray();

    /// <summary>A valid version-1 configuration body, with a second channel when asked.</summary>
    public static BodyBuilder Configuration(bool secondChannel = false, int version = LogFormat.Version, int forwardAxis = 1, int forwardSign = 1)
    {
        var b = new BodyBuilder()
            .Byte(version).Byte(0).Byte(1).Byte(2)
            .Varint(3).Varint(12_345_678).Varint(1000)
            .Byte(LogFormat.ConfigFlagAccelerometer | LogFormat.ConfigFlagStaged | (secondChannel ? LogFormat.ConfigFlagSecondChannel : 0))
            .Varint(48).Varint(1_960_000);
        if (secondChannel)
        {
            b.Varint(40).Varint(1_900_000);
        }

        return b.Varint(304_800).Varint(1_000_000).Varint(8000).Byte(forwardAxis).Byte(forwardSign)
            .Varint(1500).Varint(1_000_000).Varint(60).Varint(40).Varint(16).Varint(2_000_000).Varint(2000);
    }
}
