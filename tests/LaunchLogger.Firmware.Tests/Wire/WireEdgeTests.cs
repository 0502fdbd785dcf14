using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Wire;

/// <summary>The frame writer's guards and the stuffing's block edge inside a whole frame.</summary>
public class WireEdgeTests
{
    public static TheoryData<string> Puts => new() { "byte", "int16", "int16s", "varint", "signed varint", "bytes" };

    [Theory]
    [MemberData(nameof(Puts))]
    public void EveryPutOutsideAFrameIsRefused(string put)
    {
        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        Assert.Throws<InvalidOperationException>(() => Put(writer, put, 1));
        writer.Begin(FrameType.Event);
        writer.End();
        Assert.Throws<InvalidOperationException>(() => Put(writer, put, 1));
    }

    [Theory]
    [MemberData(nameof(Puts))]
    public void EveryPutPastTheLargestBodyIsRefusedAndTheLastThatFitsIsAccepted(string put)
    {
        // The body holds MaxPayloadBytes − CRC − header = 1024 − 4 − 3 = 1017 bytes.
        int room = LogFormat.MaxPayloadBytes - LogFormat.CrcBytes - LogFormat.HeaderBytes;
        var sink = new MemorySink();
        var writer = new FrameWriter(sink, new HealthCounters());
        writer.Begin(FrameType.Event);

        // Fill so that the put's own worst case no longer fits (a varint reserves 10 bytes).
        int needs = put switch { "byte" => 1, "int16" => 2, "int16s" => 2 * 5, "varint" or "signed varint" => Varint.MaxBytes, _ => 7 };
        writer.PutBytes(Enumerable.Repeat((byte)0x11, room - needs + 1).ToArray(), 0, room - needs + 1);
        Assert.Equal(needs - 1, writer.Remaining);
        Assert.Throws<InvalidOperationException>(() => Put(writer, put, 5));

        var fits = new FrameWriter(new MemorySink(), new HealthCounters());
        fits.Begin(FrameType.Event);
        fits.PutBytes(Enumerable.Repeat((byte)0x11, room - needs).ToArray(), 0, room - needs);
        Put(fits, put, 5);
        Assert.True(fits.End());
    }

    [Fact]
    public void ManyShortsAtOnceAreRefusedWhenTheirTotalDoesNotFit()
    {
        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        writer.Begin(FrameType.Acceleration);
        short[] values = new short[600];
        Assert.Throws<InvalidOperationException>(() => writer.PutInt16s(values, 0, 600));
    }

    [Fact]
    public void AFrameWhosePayloadEndsWithAFullBlockHasNoTrailingCodeByte()
    {
        // Payload: type, sequence 00 00, then 250 body bytes and the 4 CRC bytes, all non-zero:
        // the last 254 bytes are one full block (code FF) and the frame ends there (the rule of
        // the hand-derived "508 non-zero bytes" case in CobsTests).
        for (byte fill = 1; fill < 255; fill++)
        {
            byte[] body = Enumerable.Repeat(fill, 250).ToArray();
            byte[] payload = new byte[] { (byte)FrameType.Event, 0, 0 }.Concat(body).ToArray();
            uint crc = System.IO.Hashing.Crc32.HashToUInt32(payload);
            byte[] crcBytes = BitConverter.GetBytes(crc);
            if (crcBytes.Contains((byte)0))
            {
                continue;
            }

            var sink = new MemorySink();
            var writer = new FrameWriter(sink, new HealthCounters());
            writer.Begin(FrameType.Event);
            writer.PutBytes(body, 0, body.Length);
            Assert.True(writer.End());

            // 02 type | 01 (second zero) | FF + 254 bytes | delimiter.
            byte[] expected = new byte[] { 0x02, (byte)FrameType.Event, 0x01, 0xFF }.Concat(body).Concat(crcBytes).Append((byte)0).ToArray();
            Assert.Equal(Hex.Format(expected), Hex.Format(sink.Bytes));
            return;
        }

        Assert.Fail("no fill gave a CRC without a zero byte");
    }

    [Fact]
    public void StuffingIntoTheMiddleOfABufferReturnsTheBytesWrittenThere()
    {
        byte[] payload = Hex.Run(0x01, 0xFE);
        byte[] stuffed = new byte[300];
        int n = Cobs.Encode(payload, 0, payload.Length, stuffed, 7);
        Assert.Equal(255, n);
        Assert.Equal(0xFF, stuffed[7]);
        Assert.Equal(Hex.Format(payload), Hex.Format(stuffed, 8, 254));
    }

    [Fact]
    public void APowerUpIsALoneDelimiterThenItsFrameAndNoDelimiterGoesInsideAFrame()
    {
        var sink = new MemorySink();
        var recorder = new RunRecorder(new LoggerSettings { AccelPresent = false }, sink, new HealthCounters());
        recorder.PowerUp(100);
        Assert.Equal(0x00, sink.Bytes[0]);
        Frame frame = Assert.Single(sink.Frames);
        Assert.Equal(FrameType.PowerUp, frame.Type);

        // LOG-FORMAT.md 0x07: the clock (varint 100 = 0x64), then the firmware version.
        Assert.Equal(new byte[] { 0x64, FirmwareVersion.Major, FirmwareVersion.Minor, FirmwareVersion.Patch }, frame.Payload.Skip(LogFormat.HeaderBytes).Take(4));

        var writer = new FrameWriter(new MemorySink(), new HealthCounters());
        writer.Begin(FrameType.Event);
        Assert.Throws<InvalidOperationException>(() => writer.WriteDelimiter());
    }

    private static void Put(FrameWriter writer, string put, int n)
    {
        switch (put)
        {
            case "byte": writer.PutByte(1); break;
            case "int16": writer.PutInt16(-2); break;
            case "int16s": writer.PutInt16s(new short[n], 0, n); break;
            case "varint": writer.PutVarint(300); break;
            case "signed varint": writer.PutSignedVarint(-300); break;
            default: writer.PutBytes(new byte[] { 1, 2, 3, 4, 5, 6, 7 }, 0, 7); break;
        }
    }
}
