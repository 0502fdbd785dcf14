using System.Buffers.Binary;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A strict test-only reader of the log format (LOG-FORMAT.md): splits the stream on
/// zero bytes, unstuffs each frame with <see cref="Cobs.Decode"/>, checks its CRC against
/// System.IO.Hashing's CRC-32 (an independent implementation) and parses the body. Anything
/// malformed throws, so a test that decodes a log also checks that the log is well formed.</summary>
public static class FrameLog
{
    public static IReadOnlyList<Frame> Decode(byte[] stream)
    {
        var frames = new List<Frame>();
        int start = 0;
        for (int i = 0; i < stream.Length; i++)
        {
            if (stream[i] != 0)
            {
                continue;
            }

            if (i > start)
            {
                frames.Add(DecodeOne(stream, start, i - start));
            }

            start = i + 1;
        }

        if (start != stream.Length)
        {
            throw new InvalidDataException("stream does not end with a delimiter");
        }

        return frames;
    }

    /// <summary>Unstuffs one frame (without its delimiter) and checks its CRC; returns the payload.</summary>
    public static byte[] Unstuff(byte[] stream, int offset, int count)
    {
        byte[] payload = new byte[count];
        int n = Cobs.Decode(stream, offset, count, payload, 0);
        if (n < 0)
        {
            throw new InvalidDataException("COBS decoding failed");
        }

        if (n < LogFormat.MinPayloadBytes || n > LogFormat.MaxPayloadBytes)
        {
            throw new InvalidDataException($"payload of {n} bytes is outside the allowed sizes");
        }

        Array.Resize(ref payload, n);

        // LOG-FORMAT.md section 1: the last 4 bytes are the CRC-32/ISO-HDLC of the rest, little-endian.
        uint stored = BinaryPrimitives.ReadUInt32LittleEndian(payload.AsSpan(n - 4));
        uint computed = System.IO.Hashing.Crc32.HashToUInt32(payload.AsSpan(0, n - 4));
        if (stored != computed)
        {
            throw new InvalidDataException($"CRC mismatch: stored {stored:X8}, computed {computed:X8}");
        }

        return payload;
    }

    private static Frame DecodeOne(byte[] stream, int offset, int count)
    {
        byte[] payload = Unstuff(stream, offset, count);
        var r = new BodyReader(payload, LogFormat.HeaderBytes, payload.Length - LogFormat.CrcBytes);
        var type = (FrameType)payload[0];
        int sequence = payload[1] | (payload[2] << 8);
        Frame frame = type switch
        {
            FrameType.Configuration => ReadConfiguration(sequence, ref r),
            FrameType.Pulses => ReadPulses(sequence, ref r),
            FrameType.Acceleration => ReadAcceleration(sequence, ref r),
            FrameType.Event => ReadEvent(sequence, ref r),
            FrameType.Health => ReadHealth(sequence, ref r),
            FrameType.Summary => ReadSummary(sequence, ref r),
            FrameType.BenchRest => new BenchRestFrame(sequence, r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.U8(), r.U8()),
            FrameType.BenchRestEnd => new BenchRestEndFrame(sequence, r.Varint(), r.Varint(), r.U8(), r.Varint(), r.Varint(), r.Varint()),
            _ => new UnknownFrame(type, sequence),
        };

        if (frame is not UnknownFrame && !r.AtEnd)
        {
            throw new InvalidDataException($"{type} frame has {r.Left} bytes left over");
        }

        return frame with { Payload = payload };
    }

    private static ConfigurationFrame ReadConfiguration(int sequence, ref BodyReader r)
    {
        int version = r.U8();
        int major = r.U8(), minor = r.U8(), patch = r.U8();
        long run = r.Varint(), opened = r.Varint(), origin = r.Varint();
        int flags = r.U8();
        long ppr = r.Varint(), circ = r.Varint();
        long? ppr1 = null, circ1 = null;
        if ((flags & LogFormat.ConfigFlagSecondChannel) != 0)
        {
            ppr1 = r.Varint();
            circ1 = r.Varint();
        }

        return new ConfigurationFrame(
            sequence, version, major, minor, patch, run, opened, origin, flags, ppr, circ, ppr1, circ1,
            RolloutMicrometres: r.Varint(),
            AccelRateMilliHz: r.Varint(),
            AccelFullScaleMilliG: r.Varint(),
            ForwardAxis: r.U8(),
            ForwardSign: r.U8(),
            PreTriggerSamples: r.Varint(),
            StageHoldMicros: r.Varint(),
            StillBandMilliG: r.Varint(),
            MotionThresholdMilliG: r.Varint(),
            MotionConfirmSamples: r.Varint(),
            StopHoldMicros: r.Varint(),
            BracketLimitMicros: r.Varint(),
            StillBlockMicros: r.Varint());
    }

    private static PulsesFrame ReadPulses(int sequence, ref BodyReader r)
    {
        int channel = r.U8();
        long n = r.Varint();
        if (n < 1)
        {
            throw new InvalidDataException("pulses frame with no observation");
        }

        var list = new List<DecodedObservation>();
        long count = r.Varint();
        long lo = r.Varint();
        long hi = lo + r.PositiveVarint("width");
        list.Add(new DecodedObservation(channel, count, lo, hi));
        for (long k = 1; k < n; k++)
        {
            count += r.PositiveVarint("count delta");
            lo = hi + r.SignedVarint();
            hi = lo + r.PositiveVarint("width");
            list.Add(new DecodedObservation(channel, count, lo, hi));
        }

        return new PulsesFrame(sequence, channel, list);
    }

    private static AccelerationFrame ReadAcceleration(int sequence, ref BodyReader r)
    {
        long read = r.Varint(), first = r.Varint(), n = r.Varint();
        if (n < 1)
        {
            throw new InvalidDataException("acceleration frame with no sample");
        }

        var samples = new List<AccelSample>();
        for (long i = 0; i < n; i++)
        {
            samples.Add(new AccelSample(r.I16(), r.I16(), r.I16()));
        }

        return new AccelerationFrame(sequence, read, first, samples);
    }

    private static EventFrame ReadEvent(int sequence, ref BodyReader r)
    {
        var kind = (EventKind)r.U8();
        var e = new EventFrame(sequence, kind, r.Varint());
        return kind switch
        {
            EventKind.Staged => e with { StagedX = r.SignedVarint(), StagedY = r.SignedVarint(), StagedZ = r.SignedVarint(), StagedSamples = r.Varint() },
            EventKind.Motion => e with { Cause = (MotionCause)r.U8() },
            EventKind.Rollout => e with { SpeedMillimetresPerSecond = r.Varint() },
            EventKind.AccelGap => e with { LostSamples = r.Varint() },
            EventKind.BrakeOn or EventKind.BrakeOff when !r.AtEnd => e with { ReadGapMicros = r.Varint() },
            _ => e,
        };
    }

    private static HealthFrame ReadHealth(int sequence, ref BodyReader r)
    {
        long time = r.Varint();
        long m = r.Varint();
        var counters = new List<long>();
        for (long i = 0; i < m; i++)
        {
            counters.Add(r.Varint());
        }

        return new HealthFrame(sequence, time, counters);
    }

    private static SummaryFrame ReadSummary(int sequence, ref BodyReader r) =>
        new(sequence, r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.Varint(), r.U8());

    /// <summary>Reads the body's fields; its own LEB128 reader, independent of the firmware's.</summary>
    private ref struct BodyReader
    {
        private readonly byte[] data;
        private readonly int end;
        private int pos;

        public BodyReader(byte[] data, int start, int end)
        {
            this.data = data;
            pos = start;
            this.end = end;
        }

        public bool AtEnd => pos == end;

        public int Left => end - pos;

        public int U8()
        {
            Need(1);
            return data[pos++];
        }

        public short I16()
        {
            Need(2);
            short v = BinaryPrimitives.ReadInt16LittleEndian(data.AsSpan(pos));
            pos += 2;
            return v;
        }

        public long Varint() => checked((long)RawVarint());

        public ulong RawVarint()
        {
            ulong value = 0;
            for (int shift = 0; shift < 64; shift += 7)
            {
                Need(1);
                byte b = data[pos++];
                value |= (ulong)(b & 0x7F) << shift;
                if ((b & 0x80) == 0)
                {
                    return value;
                }
            }

            throw new InvalidDataException("varint longer than 10 bytes");
        }

        public long PositiveVarint(string what)
        {
            long v = Varint();
            if (v < 1)
            {
                throw new InvalidDataException($"{what} must be at least 1");
            }

            return v;
        }

        public long SignedVarint()
        {
            ulong u = RawVarint();
            return (long)(u >> 1) ^ -(long)(u & 1);
        }

        private void Need(int n)
        {
            if (pos + n > end)
            {
                throw new InvalidDataException("body ends inside a field");
            }
        }
    }
}
