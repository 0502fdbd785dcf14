using System.Buffers;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reading;

public class FrameReaderTests
{
    // LOG-FORMAT.md, section 4 (worked example): an event frame, type 0x04, sequence 5, Mark at
    // 1 000 000 µs. Payload 04 05 00 07 C0 84 3D, then its CRC-32/ISO-HDLC 0x3211D579 little-endian
    // (computed with an independent implementation and checked below against System.IO.Hashing);
    // stuffed by hand per Cheshire & Baker: 03 | 04 05 | 09 | 07 C0 84 3D 79 D5 11 32, then 00.
    private static readonly byte[] GoldenPayload = [0x04, 0x05, 0x00, 0x07, 0xC0, 0x84, 0x3D];
    private static readonly byte[] GoldenWire = [0x03, 0x04, 0x05, 0x09, 0x07, 0xC0, 0x84, 0x3D, 0x79, 0xD5, 0x11, 0x32, 0x00];

    [Fact]
    public void GoldenFrameFromTheWorkedExample()
    {
        // Reference library: System.IO.Hashing.Crc32 is CRC-32/ISO-HDLC.
        Assert.Equal(0x3211D579u, System.IO.Hashing.Crc32.HashToUInt32(GoldenPayload));
        Assert.Equal(GoldenWire, TestFrames.Encode(FrameType.Event, 5, 0x07, 0xC0, 0x84, 0x3D));

        TestFrames.ReadResult result = TestFrames.ReadWhole(GoldenWire);

        TestFrames.ReadFrame frame = Assert.Single(result.Frames);
        Assert.Equal(FrameType.Event, frame.Type);
        Assert.Equal(5, frame.Sequence);
        Assert.Equal(new byte[] { 0x07, 0xC0, 0x84, 0x3D }, frame.Body);
        Assert.True(FrameBodies.TryReadEvent(frame.Body, out EventBody evt));
        Assert.Equal(EventKind.Mark, evt.Kind);
        Assert.Equal(1_000_000, evt.TimeMicros);
        Assert.Equal(GoldenWire.Length, result.Stats.Bytes);
        Assert.Equal(1, result.Stats.Frames);
        Assert.False(result.Stats.HasDamage);
    }

    [Fact]
    public void TwoFramesBackToBack()
    {
        byte[] log = TestFrames.Concat(TestFrames.Mark(7, 10), TestFrames.Mark(8, 20));

        TestFrames.ReadResult result = TestFrames.ReadWhole(log);

        Assert.Equal(new ushort[] { 7, 8 }, result.Frames.Select(f => f.Sequence));
        Assert.Equal(2, result.Stats.Frames);
        Assert.False(result.Stats.HasDamage);
    }

    [Fact]
    public void TruncatedFrameNeedsMoreDataAndCountsAsCutOffAtTheEnd()
    {
        byte[] whole = TestFrames.Mark(0);
        for (int length = 1; length < whole.Length; length++)
        {
            byte[] cut = whole[..length];
            var reader = default(FrameReader);
            var payload = new byte[LogFormat.MaxPayloadBytes];

            OperationStatus streaming = reader.TryReadFrame(cut, payload, false, out int consumed, out _);
            Assert.Equal(OperationStatus.NeedMoreData, streaming);
            Assert.Equal(0, consumed);

            OperationStatus final = reader.TryReadFrame(cut, payload, true, out consumed, out _);
            Assert.Equal(OperationStatus.NeedMoreData, final);
            Assert.Equal(length, consumed);
            Assert.Equal(length, reader.Stats.TruncatedBytes);
            Assert.Equal(length, reader.Stats.BytesSkipped);
            Assert.Equal(0, reader.Stats.Frames);
        }
    }

    [Fact]
    public void EveryFlippedBitIsCaughtAndTheNextFrameStillRead()
    {
        byte[] before = TestFrames.Mark(0, 5);
        byte[] damaged = TestFrames.Mark(1, 1_000_000);
        byte[] after = TestFrames.Mark(2, 2_000_000);
        for (int i = 0; i < damaged.Length - 1; i++)
        {
            for (int bit = 0; bit < 8; bit++)
            {
                byte[] copy = (byte[])damaged.Clone();
                copy[i] ^= (byte)(1 << bit);

                TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(before, copy, after));

                Assert.Equal(new ushort[] { 0, 2 }, result.Frames.Select(f => f.Sequence));
                Assert.Equal(after[..^1], TestFrames.Encode(result.Frames[1].Type, 2, result.Frames[1].Body)[..^1]);
                Assert.True(result.Stats.CrcErrors + result.Stats.MalformedFrames >= 1, $"byte {i} bit {bit}");
                Assert.Equal(1, result.Stats.FramesLost);
                Assert.True(result.Stats.BytesSkipped >= damaged.Length);
            }
        }
    }

    [Fact]
    public void OneFlippedPayloadBitIsACrcError()
    {
        // A flip inside a data byte (not a code byte) keeps the stuffing valid: only the CRC can tell.
        byte[] wire = (byte[])GoldenWire.Clone();
        wire[5] ^= 0x10;

        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(wire, TestFrames.Mark(6)));

        Assert.Equal(1, result.Stats.CrcErrors);
        Assert.Equal(0, result.Stats.MalformedFrames);
        Assert.Equal(wire.Length, result.Stats.BytesSkipped);
        Assert.Equal(6, Assert.Single(result.Frames).Sequence);
    }

    [Fact]
    public void GarbagePrefixIsSkippedUpToTheFirstDelimiter()
    {
        byte[] garbage = [0x41, 0x42, 0x43, 0xFF, 0x17, 0x01, 0x02];
        byte[] log = TestFrames.Concat(garbage, [0x00], GoldenWire);

        TestFrames.ReadResult result = TestFrames.ReadWhole(log);

        Assert.Equal(5, Assert.Single(result.Frames).Sequence);
        Assert.Equal(1, result.Stats.CrcErrors + result.Stats.MalformedFrames);
        Assert.Equal(garbage.Length + 1, result.Stats.BytesSkipped);
        Assert.Equal(1, result.InvalidCount);
    }

    [Fact]
    public void SplitAtEveryOffsetGivesTheSameFrames()
    {
        byte[] log = TestFrames.Concat([0x13, 0x37, 0x00], TestFrames.Mark(0, 1), [0x00], LongFrame(1), TestFrames.Mark(2, 300), TestFrames.Mark(3)[..5]);
        TestFrames.ReadResult whole = TestFrames.ReadWhole(log);
        Assert.Equal(3, whole.Frames.Count);

        for (int cut = 0; cut <= log.Length; cut++)
        {
            TestFrames.ReadResult split = TestFrames.ReadInPieces(log, [cut]);
            AssertSame(whole, split);
        }

        AssertSame(whole, TestFrames.ReadInPieces(log, Enumerable.Repeat(1, log.Length)));
        AssertSame(whole, TestFrames.ReadInPieces(log, Enumerable.Repeat(7, log.Length)));
    }

    [Fact]
    public void FrameTooLongIsSkippedWithoutBuffering()
    {
        byte[] junk = Enumerable.Range(0, 3000).Select(i => (byte)(1 + (i % 250))).ToArray();
        byte[] log = TestFrames.Concat(TestFrames.Mark(0), junk, [0x00], TestFrames.Mark(1));

        TestFrames.ReadResult whole = TestFrames.ReadWhole(log);
        TestFrames.ReadResult trickle = TestFrames.ReadInPieces(log, Enumerable.Repeat(100, log.Length));

        foreach (TestFrames.ReadResult result in new[] { whole, trickle })
        {
            Assert.Equal(new ushort[] { 0, 1 }, result.Frames.Select(f => f.Sequence));
            Assert.Equal(1, result.Stats.MalformedFrames);
            Assert.Equal(junk.Length + 1, result.Stats.BytesSkipped);
            Assert.Equal(0, result.Stats.FramesLost);
        }

        // The streaming caller never had to hold more than one frame's worth of bytes.
        Assert.True(trickle.MostPending <= LogFormat.MaxEncodedFrameBytes, $"held {trickle.MostPending} bytes");
    }

    [Fact]
    public void LongestValidPayloadIsReadAndOneMoreByteIsRejected()
    {
        byte[] longest = LongFrame(0, LogFormat.MaxPayloadBytes - LogFormat.MinPayloadBytes);
        byte[] tooLong = LongFrame(1, LogFormat.MaxPayloadBytes - LogFormat.MinPayloadBytes + 1);

        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(longest, tooLong, TestFrames.Mark(2)));

        Assert.Equal(new ushort[] { 0, 2 }, result.Frames.Select(f => f.Sequence));
        Assert.Equal(LogFormat.MaxPayloadBytes - LogFormat.MinPayloadBytes, result.Frames[0].Body.Length);
        Assert.Equal(1, result.Stats.MalformedFrames);
    }

    [Fact]
    public void PayloadShorterThanHeaderAndCrcIsMalformed()
    {
        byte[] tooShort = TestFrames.Stuff([0x04, 0x05, 0x00, 0x01, 0x02, 0x03]);

        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(tooShort, GoldenWire));

        Assert.Equal(1, result.Stats.MalformedFrames);
        Assert.Single(result.Frames);
    }

    [Theory]
    [InlineData("gap of three", 5, 9, 3)]
    [InlineData("wrap without loss", 65535, 0, 0)]
    [InlineData("gap across the wrap", 65534, 1, 2)]
    [InlineData("no gap", 41, 42, 0)]
    public void SequenceGapsCountLostFrames(string name, int first, int second, long lost)
    {
        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(first), TestFrames.Mark(second)));

        Assert.Equal(2, result.Frames.Count);
        Assert.True(lost == result.Stats.FramesLost, name);
    }

    [Fact]
    public void RestartWithAConfigurationFrameIsNotALoss()
    {
        byte[] restart = TestFrames.Encode(FrameType.Configuration, 0, 0x01);

        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(300), restart, TestFrames.Mark(1)));

        Assert.Equal(0, result.Stats.FramesLost);
        Assert.Equal(1, result.Stats.Restarts);
    }

    [Fact]
    public void EmptyFramesAreIgnored()
    {
        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat([0x00, 0x00], GoldenWire, [0x00], TestFrames.Mark(6)[..^1], [0x00, 0x00]));

        Assert.Equal(2, result.Frames.Count);
        Assert.Equal(4, result.Stats.EmptyFrames);
        Assert.False(result.Stats.HasDamage);
        Assert.Equal(0, result.InvalidCount);
    }

    [Fact]
    public void UnknownFrameTypesAreReturnedAndCounted()
    {
        TestFrames.ReadResult result = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Encode((FrameType)0x7E, 0, 1, 2, 3), TestFrames.Mark(1)));

        Assert.Equal((FrameType)0x7E, result.Frames[0].Type);
        Assert.Equal(1, result.Stats.UnknownFrameTypes);
        Assert.Equal(2, result.Stats.Frames);
    }

    [Fact]
    public void TrailingCodeByteAfterAFullBlockIsAccepted()
    {
        // LOG-FORMAT.md, section 1: a payload ending exactly after a 254-byte non-zero run may
        // carry the paper encoder's trailing 01; both forms decode to the same frame.
        // Sequence 0x0303 keeps zeros out of the header too.
        byte[] wire = LongFrame(0x0303, 254 - LogFormat.MinPayloadBytes, nonZero: true);
        Assert.Equal(0xFF, wire[0]);
        Assert.Equal(256, wire.Length);
        byte[] withTrailingCode = TestFrames.Concat(wire[..^1], [0x01, 0x00]);

        TestFrames.ReadResult plain = TestFrames.ReadWhole(wire);
        TestFrames.ReadResult paper = TestFrames.ReadWhole(withTrailingCode);

        Assert.Equal(plain.Frames.Single().Body, paper.Frames.Single().Body);
    }

    [Fact]
    public void TooSmallPayloadBufferIsACallerBug()
    {
        var reader = default(FrameReader);
        byte[] small = new byte[LogFormat.MaxPayloadBytes - 1];

        Assert.Throws<ArgumentException>(() => reader.TryReadFrame(GoldenWire, small, true, out _, out _));
    }

    /// <summary>A frame of unknown type 0x7F whose body has <paramref name="bodyBytes"/> bytes.</summary>
    private static byte[] LongFrame(int sequence, int bodyBytes = 600, bool nonZero = false)
    {
        // For the 254-byte case the CRC must not hold a zero either; search a body that gives one.
        for (int salt = 0; ; salt++)
        {
            byte[] body = Enumerable.Range(0, bodyBytes).Select(i => (byte)(nonZero ? 1 + ((i + salt) % 255) : (i * 7) % 256)).ToArray();
            byte[] wire = TestFrames.Encode((FrameType)0x7F, sequence, body);
            if (!nonZero || wire.Length == bodyBytes + LogFormat.MinPayloadBytes + 2)
            {
                return wire;
            }
        }
    }

    private static void AssertSame(TestFrames.ReadResult expected, TestFrames.ReadResult actual)
    {
        Assert.Equal(expected.Frames, actual.Frames, (a, b) => a.Type == b.Type && a.Sequence == b.Sequence && a.Body.SequenceEqual(b.Body));
        Assert.Equal(expected.Stats, actual.Stats);
        Assert.Equal(expected.InvalidCount, actual.InvalidCount);
    }
}
