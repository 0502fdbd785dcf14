using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Simulation.Tests.Support;

/// <summary>A minimal reader of the log format for tests, built on the firmware's own
/// <see cref="Cobs"/>, <see cref="Crc32"/> and <see cref="Varint"/> (LOG-FORMAT.md).</summary>
internal sealed class LogFrames
{
    private LogFrames(List<Frame> frames, int bad)
    {
        Frames = frames;
        BadFrames = bad;
    }

    internal List<Frame> Frames { get; }

    /// <summary>Frames whose stuffing or CRC did not check.</summary>
    internal int BadFrames { get; }

    internal static LogFrames Parse(byte[] log)
    {
        var frames = new List<Frame>();
        int bad = 0;
        var payload = new byte[LogFormat.MaxPayloadBytes + 8];
        int start = 0;
        for (int i = 0; i < log.Length; i++)
        {
            if (log[i] != LogFormat.Delimiter)
            {
                continue;
            }

            if (i == start)
            {
                // An empty frame (LOG-FORMAT.md, section 1: readers ignore them): the lone
                // delimiter the box writes at power-up.
                start = i + 1;
                continue;
            }

            int n = Cobs.Decode(log, start, i - start, payload, 0);
            start = i + 1;
            if (n < LogFormat.MinPayloadBytes)
            {
                bad++;
                continue;
            }

            uint crc = (uint)(payload[n - 4] | (payload[n - 3] << 8) | (payload[n - 2] << 16) | (payload[n - 1] << 24));
            if (crc != Crc32.Compute(payload, 0, n - 4))
            {
                bad++;
                continue;
            }

            frames.Add(new Frame((FrameType)payload[0], payload[1] | (payload[2] << 8), payload[LogFormat.HeaderBytes..(n - LogFormat.CrcBytes)]));
        }

        return new LogFrames(frames, bad);
    }

    internal IEnumerable<Frame> OfType(FrameType type) => Frames.Where(f => f.Type == type);

    /// <summary>Events as (kind, time µs).</summary>
    internal IEnumerable<(EventKind Kind, long TimeMicros)> Events() =>
        OfType(FrameType.Event).Select(f =>
        {
            var r = f.Reader();
            byte kind = r.Byte();
            return ((EventKind)kind, (long)r.Varint());
        });

    /// <summary>Acceleration frames as (read time µs, first index, samples x,y,z).</summary>
    internal IEnumerable<(long ReadMicros, long FirstIndex, short[] Xyz)> Acceleration() =>
        OfType(FrameType.Acceleration).Select(f =>
        {
            var r = f.Reader();
            long read = (long)r.Varint();
            long index = (long)r.Varint();
            int n = (int)r.Varint();
            var xyz = new short[n * 3];
            for (int i = 0; i < xyz.Length; i++)
            {
                xyz[i] = r.Int16();
            }

            return (read, index, xyz);
        });

    /// <summary>The summary frames' fields in LOG-FORMAT.md order (the flags byte last).</summary>
    internal IEnumerable<long[]> Summaries() =>
        OfType(FrameType.Summary).Select(f =>
        {
            var r = f.Reader();
            var fields = new long[11];
            for (int i = 0; i < 10; i++)
            {
                fields[i] = (long)r.Varint();
            }

            fields[10] = r.Byte();
            return fields;
        });

    internal sealed record Frame(FrameType Type, int Sequence, byte[] Body)
    {
        internal BodyReader Reader() => new(Body);
    }

    internal sealed class BodyReader(byte[] body)
    {
        private int at;

        internal byte Byte() => body[at++];

        internal short Int16()
        {
            short v = (short)(body[at] | (body[at + 1] << 8));
            at += 2;
            return v;
        }

        internal ulong Varint()
        {
            int n = LaunchLogger.Firmware.Wire.Varint.Read(body, at, body.Length, out ulong value);
            if (n == 0)
            {
                throw new InvalidDataException("bad varint");
            }

            at += n;
            return value;
        }
    }
}
