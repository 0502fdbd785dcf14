using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>Splits a log into frames with the firmware's own Cobs.Decode and checks each CRC
/// with the firmware's Crc32 (LOG-FORMAT.md, section 1).</summary>
internal static class LogFrames
{
    public sealed record Frame(FrameType Type, int Sequence, byte[] Payload, bool CrcOk);

    public static List<Frame> Decode(byte[] log)
    {
        var frames = new List<Frame>();
        byte[] payload = new byte[LogFormat.MaxPayloadBytes + 8];
        int start = 0;
        for (int i = 0; i < log.Length; i++)
        {
            if (log[i] != LogFormat.Delimiter)
            {
                continue;
            }

            if (i == start)
            {
                // An empty frame, which readers ignore: the lone delimiter written at power-up.
                start = i + 1;
                continue;
            }

            int n = Cobs.Decode(log, start, i - start, payload, 0);
            start = i + 1;
            if (n < LogFormat.MinPayloadBytes)
            {
                frames.Add(new Frame(0, -1, Array.Empty<byte>(), false));
                continue;
            }

            uint stored = (uint)(payload[n - 4] | (payload[n - 3] << 8) | (payload[n - 2] << 16) | (payload[n - 1] << 24));
            bool ok = stored == Crc32.Compute(payload, 0, n - 4);
            frames.Add(new Frame((FrameType)payload[0], payload[1] | (payload[2] << 8), payload.AsSpan(0, n).ToArray(), ok));
        }

        return frames;
    }

    /// <summary>The varint that ends a frame's payload, just before its CRC (the configuration's
    /// still block: LOG-FORMAT.md 0x01).</summary>
    public static long LastVarint(byte[] payload)
    {
        int end = payload.Length - 4;
        int start = end - 1;
        while ((payload[start - 1] & 0x80) != 0)
        {
            start--;
        }

        Assert.True(Varint.Read(payload, start, end, out ulong value) == end - start);
        return (long)value;
    }

    /// <summary>Bytes after the last delimiter (a cut-off frame), which a whole log never has.</summary>
    public static int TrailingBytes(byte[] log)
    {
        int last = Array.LastIndexOf(log, LogFormat.Delimiter);
        return log.Length - (last + 1);
    }
}
