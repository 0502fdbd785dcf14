using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Wire;

public class FrameWriterTests
{
    [Fact]
    public void TheWorkedExampleOfLogFormatSection4ByteForByte()
    {
        var sink = new MemorySink();
        var writer = new FrameWriter(sink, new HealthCounters());
        for (int i = 0; i < 5; i++)
        {
            writer.Begin(FrameType.Health);
            writer.End();
        }

        sink.Clear();
        writer.Begin(FrameType.Event);
        writer.PutByte((byte)EventKind.Mark);
        writer.PutVarint(1_000_000);
        Assert.True(writer.End());

        // LOG-FORMAT.md section 4: payload 04 05 00 07 C0 84 3D + CRC-32 little-endian. The CRC
        // 0x3211D579 was computed with zlib's crc32 (an independent implementation) and is checked
        // here against System.IO.Hashing too; COBS by hand: 03 04 05 | 09 + the eight bytes after the zero.
        byte[] payload = Hex.Parse("04 05 00 07 C0 84 3D");
        Assert.Equal(0x3211D579u, System.IO.Hashing.Crc32.HashToUInt32(payload));
        Assert.Equal("0304050907C0843D79D5113200", Hex.Format(sink.Bytes));

        var frame = Assert.IsType<EventFrame>(Assert.Single(sink.Frames));
        Assert.Equal(5, frame.Sequence);
        Assert.Equal(EventKind.Mark, frame.Kind);
        Assert.Equal(1_000_000, frame.TimeMicros);
    }

    [Fact]
    public void SequenceNumbersIncrementAndWrapAt65536()
    {
        var sink = new MemorySink();
        var writer = new FrameWriter(sink, null!);
        const int total = 65536 + 3;
        for (int i = 0; i < total; i++)
        {
            WriteMark(writer, i);
        }

        IReadOnlyList<Frame> frames = sink.Frames;
        Assert.Equal(total, frames.Count);
        for (int i = 0; i < total; i++)
        {
            Assert.Equal(i & 0xFFFF, frames[i].Sequence);
            Assert.Equal(i, ((EventFrame)frames[i]).TimeMicros);
        }

        Assert.Equal(total, writer.FramesWritten);
    }

    [Fact]
    public void RefusedFramesAreCountedAndStillUseASequenceNumber()
    {
        var sink = new MemorySink();
        var health = new HealthCounters();
        var writer = new FrameWriter(sink, health);
        WriteMark(writer, 1);
        sink.RefuseNext = 2;
        Assert.False(WriteMark(writer, 2));
        Assert.False(WriteMark(writer, 3));
        Assert.True(WriteMark(writer, 4));

        Assert.Equal(2, health.FramesRefused);
        Assert.Equal(4, writer.FramesWritten);

        // The gap in sequence numbers is how a reader learns that frames were lost (LOG-FORMAT.md section 1).
        Assert.Equal(new[] { 0, 3 }, sink.Frames.Select(f => f.Sequence));
        Assert.Equal(new long[] { 1, 4 }, sink.Frames.Cast<EventFrame>().Select(f => f.TimeMicros));
    }

    [Fact]
    public void EveryPutKindLandsLittleEndianInTheBody()
    {
        var sink = new MemorySink();
        var writer = new FrameWriter(sink, null!);
        writer.Begin(FrameType.Acceleration);
        writer.PutByte(0xAB);
        writer.PutInt16(-2);
        writer.PutInt16(0x1234);
        writer.PutVarint(300);
        writer.PutSignedVarint(-2);
        writer.PutBytes(new byte[] { 9, 8, 7, 6 }, 1, 2);
        writer.End();

        byte[] payload = FrameLog.Unstuff(sink.Bytes, 0, sink.Bytes.Length - 1);
        Assert.Equal("030000" + "AB" + "FEFF" + "3412" + "AC02" + "03" + "0807", Hex.Format(payload, 0, payload.Length - 4));
    }

    [Fact]
    public void EndWithoutBeginThrows()
    {
        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        Assert.Throws<InvalidOperationException>(() => writer.End());
    }

    [Fact]
    public void BeginTwiceThrows()
    {
        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        writer.Begin(FrameType.Event);
        Assert.Throws<InvalidOperationException>(() => writer.Begin(FrameType.Event));
    }

    [Fact]
    public void PutOutsideAFrameThrows()
    {
        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        Assert.Throws<InvalidOperationException>(() => writer.PutByte(1));
    }

    [Fact]
    public void ABodyLongerThanTheLargestPayloadThrows()
    {
        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        writer.Begin(FrameType.Acceleration);
        int room = LogFormat.MaxPayloadBytes - LogFormat.HeaderBytes - LogFormat.CrcBytes;
        Assert.Equal(room, writer.Remaining);
        writer.PutBytes(new byte[room], 0, room);
        Assert.Equal(0, writer.Remaining);
        Assert.Throws<InvalidOperationException>(() => writer.PutByte(1));
    }

    [Fact]
    public void AFullSizeFrameIsWrittenAndDecodes()
    {
        var sink = new MemorySink();
        var writer = new FrameWriter(sink, null!);
        writer.Begin(FrameType.Acceleration);
        byte[] body = new byte[writer.Remaining];
        new Random(3).NextBytes(body);
        writer.PutBytes(body, 0, body.Length);
        writer.End();

        byte[] payload = FrameLog.Unstuff(sink.Bytes, 0, sink.Bytes.Length - 1);
        Assert.Equal(LogFormat.MaxPayloadBytes, payload.Length);
        Assert.Equal(body, payload.Skip(LogFormat.HeaderBytes).Take(body.Length));
    }

    [Fact]
    public void NegativeUnsignedVarintIsACallerBug()
    {
        var writer = new FrameWriter(new MemorySink(), null!);
        writer.Begin(FrameType.Event);
        Assert.Throws<ArgumentOutOfRangeException>(() => writer.PutVarint(-1));
    }

    [Fact]
    public void ANullSinkIsRejected()
    {
        Assert.Throws<ArgumentNullException>(() => new FrameWriter(null!, new HealthCounters()));
    }

    private static bool WriteMark(FrameWriter writer, long time)
    {
        writer.Begin(FrameType.Event);
        writer.PutByte((byte)EventKind.Mark);
        writer.PutVarint(time);
        return writer.End();
    }
}
