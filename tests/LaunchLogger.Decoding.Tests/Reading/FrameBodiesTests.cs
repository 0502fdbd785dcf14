using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reading;

public class FrameBodiesTests
{
    [Fact]
    public void ConfigurationFieldsInLogOrder()
    {
        Assert.True(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration(secondChannel: true).ToArray(), out ConfigurationBody c));

        Assert.Equal((1, 0, 1, 2), (c.FormatVersion, c.FirmwareMajor, c.FirmwareMinor, c.FirmwarePatch));
        Assert.Equal((3L, 12_345_678L, 1000L), (c.RunNumber, c.OpenedMicros, c.OriginCount));
        Assert.True(c.AccelPresent && c.Staged && c.SecondChannelPresent);
        Assert.Equal((48, 1_960_000L, 40, 1_900_000L), (c.PulsesPerRevolution, c.CircumferenceMicrometres, c.SecondPulsesPerRevolution, c.SecondCircumferenceMicrometres));
        Assert.Equal((304_800L, 1_000_000L, 8000L), (c.RolloutMicrometres, c.AccelOutputDataRateMilliHz, c.AccelFullScaleMilliG));
        Assert.Equal((1, true), (c.ForwardAxis, c.ForwardAxisReversed));
        Assert.Equal((1500L, 1_000_000L, 60L, 40L, 16L, 2_000_000L, 2000L), (c.PreTriggerSamples, c.StageHoldMicros, c.StillBandMilliG, c.MotionThresholdMilliG, c.MotionConfirmSamples, c.StopHoldMicros, c.BracketLimitMicros));
    }

    [Fact]
    public void ConfigurationWithoutSecondChannelSkipsItsFields()
    {
        Assert.True(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration().ToArray(), out ConfigurationBody c));
        Assert.False(c.SecondChannelPresent);
        Assert.Equal(304_800L, c.RolloutMicrometres);
    }

    [Fact]
    public void TheStillBlockLengthIsReadWhenTheBoxWroteIt()
    {
        // LOG-FORMAT.md 0x01: the block length was appended later; a body without it is a log from before.
        Assert.True(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration().ToArray(), out ConfigurationBody before));
        Assert.True(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration().Varint(50_000).ToArray(), out ConfigurationBody now));
        Assert.True(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration(secondChannel: true).Varint(80_000).ToArray(), out ConfigurationBody second));

        Assert.Equal(0, before.StillBlockMicros);
        Assert.Equal(50_000, now.StillBlockMicros);
        Assert.Equal(80_000, second.StillBlockMicros);
        Assert.Equal(before with { StillBlockMicros = 50_000 }, now);
    }

    [Fact]
    public void FieldsAppendedAfterTheStillBlockAreIgnoredAndABrokenOneRejects()
    {
        // A later writer may append more (section 1, appended fields); a field cut inside its
        // varint is a body that does not parse.
        Assert.True(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration().Varint(50_000).Varint(7).Byte(3).ToArray(), out ConfigurationBody later));
        Assert.Equal(50_000, later.StillBlockMicros);
        Assert.False(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration().Byte(0x80).ToArray(), out _));
    }

    [Theory]
    [InlineData("newer version", 2, 1, 0)]
    [InlineData("forward axis 3", 1, 3, 0)]
    [InlineData("forward sign 2", 1, 0, 2)]
    public void ImpossibleConfigurationIsRejected(string name, int version, int axis, int sign)
    {
        Assert.False(FrameBodies.TryReadConfiguration(BodyBuilder.Configuration(false, version, axis, sign).ToArray(), out _), name);
    }

    [Fact]
    public void PulsesUndoTheDeltaCodingIncludingANegativeGap()
    {
        // count 5 in (1000, 1001]; count 7 in (998, 1248] — the bracket starts 3 µs before the
        // previous one ended, as a polling board's may; count 8 in (1300, 1301].
        byte[] body = new BodyBuilder().Byte(1).Varint(3)
            .Varint(5).Varint(1000).Varint(1)
            .Varint(2).Svarint(-3).Varint(250)
            .Varint(1).Svarint(52).Varint(1)
            .ToArray();
        var into = new List<PulseObservation>();

        Assert.True(FrameBodies.TryReadPulses(body, out int channel, into));

        Assert.Equal(1, channel);
        Assert.Equal(
            new[] { (5L, 1000L, 1001L), (7L, 998L, 1248L), (8L, 1300L, 1301L) },
            into.Select(p => (p.Count, p.LoMicros, p.HiMicros)));
        Assert.All(into, p => Assert.Equal(1, p.Channel));
    }

    public static TheoryData<string, byte[]> BadPulses => new()
    {
        { "no observations", new BodyBuilder().Byte(0).Varint(0).ToArray() },
        { "fewer observations than n", new BodyBuilder().Byte(0).Varint(2).Varint(1).Varint(10).Varint(1).ToArray() },
        { "zero width", new BodyBuilder().Byte(0).Varint(1).Varint(1).Varint(10).Varint(0).ToArray() },
        { "first count zero", new BodyBuilder().Byte(0).Varint(1).Varint(0).Varint(10).Varint(1).ToArray() },
        { "count does not rise", new BodyBuilder().Byte(0).Varint(2).Varint(1).Varint(10).Varint(1).Varint(0).Svarint(5).Varint(1).ToArray() },
        { "bracket before time zero", new BodyBuilder().Byte(0).Varint(2).Varint(1).Varint(10).Varint(1).Varint(1).Svarint(-20).Varint(1).ToArray() },
        { "trailing byte", new BodyBuilder().Byte(0).Varint(1).Varint(1).Varint(10).Varint(1).Byte(9).ToArray() },
        { "channel 2", new BodyBuilder().Byte(2).Varint(1).Varint(1).Varint(10).Varint(1).ToArray() },
        { "varint runs past the end", new byte[] { 0, 1, 1, 0x80 } },

        // The gap lifts the bracket start past the field limit, where adding the width would
        // overflow a 64-bit integer: the body is refused instead of wrapping round.
        { "bracket start beyond the field limit", new BodyBuilder().Byte(0).Varint(2).Varint(1).Varint((1L << 62) - 10).Varint(5).Varint(1).Svarint(1L << 60).Varint((1L << 62) - 1).ToArray() },
    };

    [Theory]
    [MemberData(nameof(BadPulses))]
    public void BadPulsesAreRejectedAndLeaveTheListAsItWas(string name, byte[] body)
    {
        var into = new List<PulseObservation> { new() { Count = 99 } };

        Assert.False(FrameBodies.TryReadPulses(body, out _, into), name);
        Assert.Equal(99, Assert.Single(into).Count);
    }

    [Fact]
    public void AccelerationSamplesStayInPlace()
    {
        byte[] body = new BodyBuilder().Varint(2_000_000).Varint(4000).Varint(2)
            .Int16(10).Int16(-20).Int16(1000)
            .Int16(-32768).Int16(32767).Int16(0)
            .ToArray();

        Assert.True(FrameBodies.TryReadAcceleration(body, out AccelerationBody a));

        Assert.Equal((2_000_000L, 4000L, 2, 4001L), (a.ReadMicros, a.FirstIndex, a.Count, a.LastIndex));
        Assert.Equal(new short[] { 10, -20, 1000, -32768, 32767, 0 }, new[] { a.MilliG(0, 0), a.MilliG(0, 1), a.MilliG(0, 2), a.MilliG(1, 0), a.MilliG(1, 1), a.MilliG(1, 2) });
    }

    [Theory]
    [InlineData("no samples", 0, 0)]
    [InlineData("one byte short", 2, 11)]
    [InlineData("one byte over", 1, 7)]
    public void AccelerationWithTheWrongSizeIsRejected(string name, int n, int sampleBytes)
    {
        byte[] body = [.. new BodyBuilder().Varint(1).Varint(0).Varint(n).ToArray(), .. new byte[sampleBytes]];

        Assert.False(FrameBodies.TryReadAcceleration(body, out _), name);
    }

    public static TheoryData<string, byte[], EventKind, long[]> Events => new()
    {
        { "staged", new BodyBuilder().Byte(1).Varint(500).Svarint(-12).Svarint(3).Svarint(998).Varint(1000).ToArray(), EventKind.Staged, new long[] { -12, 3, 998, 1000 } },
        { "motion", new BodyBuilder().Byte(2).Varint(500).Byte(2).ToArray(), EventKind.Motion, new long[] { 2 } },
        { "rollout", new BodyBuilder().Byte(3).Varint(500).Varint(1729).ToArray(), EventKind.Rollout, new long[] { 1729 } },
        { "stopped", new BodyBuilder().Byte(4).Varint(500).ToArray(), EventKind.Stopped, Array.Empty<long>() },
        { "brake on, older log", new BodyBuilder().Byte(5).Varint(500).ToArray(), EventKind.BrakeOn, Array.Empty<long>() },
        { "brake on with the loop's gap", new BodyBuilder().Byte(5).Varint(500).Varint(1020).ToArray(), EventKind.BrakeOn, new long[] { 1020 } },
        { "brake off with the loop's gap", new BodyBuilder().Byte(6).Varint(500).Varint(20_400).ToArray(), EventKind.BrakeOff, new long[] { 20_400 } },
        { "accel gap", new BodyBuilder().Byte(8).Varint(500).Varint(37).ToArray(), EventKind.AccelGap, new long[] { 37 } },
        { "unknown kind", new BodyBuilder().Byte(99).Varint(500).Byte(1).ToArray(), (EventKind)99, Array.Empty<long>() },
    };

    [Theory]
    [MemberData(nameof(Events))]
    public void EventsCarryTheirKindsFields(string name, byte[] body, EventKind kind, long[] values)
    {
        Assert.True(FrameBodies.TryReadEvent(body, out EventBody evt), name);
        Assert.Equal(kind, evt.Kind);
        Assert.Equal(500, evt.TimeMicros);
        Assert.Equal(values, evt.Values);
    }

    [Fact]
    public void EventMissingItsFieldsIsRejected()
    {
        Assert.False(FrameBodies.TryReadEvent(new BodyBuilder().Byte(1).Varint(500).Svarint(1).ToArray(), out _));
        Assert.False(FrameBodies.TryReadEvent(new BodyBuilder().Byte(2).Varint(500).ToArray(), out _));
        Assert.False(FrameBodies.TryReadEvent([], out _));
    }

    [Theory]
    [InlineData("all nine", 9, 9)]
    [InlineData("two more than known", 11, 9)]
    [InlineData("an older writer's three", 3, 3)]
    public void HealthKeepsTheCountersItKnows(string name, int sent, int kept)
    {
        var b = new BodyBuilder().Varint(7_000_000).Varint(sent);
        for (int i = 0; i < sent; i++)
        {
            b.Varint(100 + i);
        }

        Assert.True(FrameBodies.TryReadHealth(b.ToArray(), out HealthBody h), name);
        Assert.Equal(7_000_000, h.TimeMicros);
        Assert.Equal(Enumerable.Range(100, kept).Select(i => (long)i), h.Counters);
    }

    [Fact]
    public void HealthWithFewerCountersThanItSaysIsRejected()
    {
        Assert.False(FrameBodies.TryReadHealth(new BodyBuilder().Varint(1).Varint(9).Varint(1).Varint(2).ToArray(), out _));
    }

    [Fact]
    public void SummaryFieldsAndFlags()
    {
        byte[] body = new BodyBuilder().Varint(2).Varint(100).Varint(200).Varint(300).Varint(400).Varint(500)
            .Varint(0).Varint(501).Varint(9000).Varint(120).Byte(LogFormat.SummaryFlagStaged | LogFormat.SummaryFlagClosedByStop).ToArray();

        Assert.True(FrameBodies.TryReadSummary(body, out SummaryBody s));

        Assert.Equal((2L, 100L, 200L, 300L, 400L), (s.RunNumber, s.OpenedMicros, s.MotionMicros, s.RolloutMicros, s.StoppedMicros));
        Assert.Equal((500L, 0L, 501L, 9000L, 120L), (s.Channel0Count, s.Channel1Count, s.ObservationsWritten, s.AccelSamplesWritten, s.FramesWritten));
        Assert.Equal((true, false, true), (s.Staged, s.RolloutReached, s.ClosedByStop));
        Assert.False(FrameBodies.TryReadSummary(body[..^1], out _));
    }

    [Fact]
    public void RandomBytesNeverThrow()
    {
        var random = new Random(2026);
        var into = new List<PulseObservation>();
        for (int k = 0; k < 20_000; k++)
        {
            byte[] body = new byte[random.Next(0, 48)];
            random.NextBytes(body);
            if (body.Length > 0 && random.Next(2) == 0)
            {
                body[0] = (byte)random.Next(0, 10);
            }

            FrameBodies.TryReadConfiguration(body, out _);
            FrameBodies.TryReadPulses(body, out _, into);
            FrameBodies.TryReadAcceleration(body, out _);
            FrameBodies.TryReadEvent(body, out _);
            FrameBodies.TryReadHealth(body, out _);
            FrameBodies.TryReadSummary(body, out _);
        }

        Assert.All(into, p => Assert.True(p.Count >= 1 && p.LoMicros >= 0 && p.HiMicros > p.LoMicros));
    }

    [Fact]
    public void VarintsBeyondTheFieldLimitAreRejected()
    {
        // 2^62 takes nine bytes; the reader keeps fields below it so sums cannot overflow.
        byte[] huge = new BodyBuilder().Varint(1L << 62).Varint(0).Varint(1).Int16(0).Int16(0).Int16(0).ToArray();
        byte[] fine = new BodyBuilder().Varint((1L << 62) - 2).Varint(0).Varint(1).Int16(0).Int16(0).Int16(0).ToArray();

        Assert.False(FrameBodies.TryReadAcceleration(huge, out _));
        Assert.True(FrameBodies.TryReadAcceleration(fine, out _));
    }
}
