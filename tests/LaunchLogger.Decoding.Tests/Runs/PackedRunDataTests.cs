using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Reading;
using LaunchLogger.Firmware.Wire;
using UnitsNet;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>The reader keeps a run's pulses and accelerometer samples packed and builds records
/// and arrays when they are read: what comes out is what the frames say, sample by sample, on
/// the packed path and on the paths for data that does not pack.</summary>
public class PackedRunDataTests
{
    private const long OpenedMicros = 12_345_678;

    [Fact]
    public void Accelerometer_samples_that_repeat_or_go_back_are_dropped_one_by_one_and_the_rest_read_as_written()
    {
        // Frame 2 repeats samples 5–9 of frame 1 and adds 10–14; frame 3 goes back to 0–4;
        // frame 4 starts at 20 (samples 15–19 lost). Every sample reads x = index,
        // y = 100 + index, z = 1000 (milli-g); the forward axis is y.
        byte[] log = TestFrames.Concat(
            TestFrames.Encode(FrameType.Configuration, 1, BodyBuilder.Configuration(forwardSign: 0).ToArray()),
            AccelerationFrame(2, OpenedMicros + 10_000, first: 0, count: 10),
            AccelerationFrame(3, OpenedMicros + 15_000, first: 5, count: 10),
            AccelerationFrame(4, OpenedMicros + 20_000, first: 0, count: 5),
            AccelerationFrame(5, OpenedMicros + 30_000, first: 20, count: 10));

        DecodedRun run = Assert.Single(LogReader.Read(log, "samples.log").Runs);
        AccelSeries accel = run.Accel!;

        long[] expectedIndex = [.. Enumerable.Range(0, 15).Select(i => (long)i), .. Enumerable.Range(20, 10).Select(i => (long)i)];
        Assert.Equal(expectedIndex.Length, accel.Count);
        Assert.Equal(expectedIndex, accel.SampleIndex);
        Assert.Contains(run.Warnings, w => w.StartsWith("10 accelerometer sample(s) repeated or out of order were dropped", StringComparison.Ordinal));
        for (int i = 0; i < accel.Count; i++)
        {
            // milli-g to m/s² by UnitsNet (standard gravity 9.80665 m/s², 3rd CGPM).
            double forward = Acceleration.FromStandardGravity((100 + expectedIndex[i]) / 1000.0).MetersPerSecondSquared;
            Assert.Equal(forward, accel.ForwardMps2[i], 1e-12);
            Assert.Equal(Acceleration.FromStandardGravity(1.0).MetersPerSecondSquared, accel.VerticalMps2[i], 1e-12);
            Assert.Equal(Acceleration.FromStandardGravity(expectedIndex[i] / 1000.0).MetersPerSecondSquared, Math.Abs(accel.LateralMps2[i]), 1e-12);
        }

        // Times step by the period within each stretch of numbering, and on over the lost samples.
        for (int i = 1; i < accel.Count; i++)
        {
            Assert.Equal((expectedIndex[i] - expectedIndex[i - 1]) * accel.SamplePeriodS, accel.TimeS[i] - accel.TimeS[i - 1], 1e-12);
        }

        // Each array is built once and the same one is handed out again.
        Assert.Same(accel.TimeS, accel.TimeS);
        Assert.Same(accel.ForwardMps2, accel.ForwardMps2);
    }

    [Fact]
    public void Pulse_counts_too_far_apart_to_pack_are_read_exactly_as_well()
    {
        // 10,000 pulses per revolution of a 1.2 m tyre (0.12 mm per pulse, near the finest
        // InputLimits allows): a run may count 9e9 pulses, beyond the 2^32 the packed form holds
        // above its first count. The second observation comes 5e9 pulses (600 km) and 2,999 s
        // after the first, within 300 m/s, so it is kept.
        byte[] configuration = Configuration(pulsesPerRevolution: 10_000, circumferenceMicrometres: 1_200_000);
        long firstLo = OpenedMicros + 1_000_000;
        long secondLo = OpenedMicros + 3_000_000_000;
        byte[] log = TestFrames.Concat(
            TestFrames.Encode(FrameType.Configuration, 1, configuration),
            Pulses(2, count: 1, lo: firstLo, width: 250),
            Pulses(3, count: 5_000_000_001, lo: secondLo, width: 40),
            Pulses(4, count: 5_000_000_002, lo: secondLo + 100, width: 30));

        DecodedRun run = Assert.Single(LogReader.Read(log, "far.log").Runs);

        // µs to s: divided by 10^6, the nearest double to each exact value.
        Assert.Equal(
            [
                new PulseRecord(1, firstLo / 1e6, (firstLo + 250) / 1e6),
                new PulseRecord(5_000_000_001, secondLo / 1e6, (secondLo + 40) / 1e6),
                new PulseRecord(5_000_000_002, (secondLo + 100) / 1e6, (secondLo + 130) / 1e6),
            ],
            run.Pulses);
    }

    [Fact]
    public void Packed_pulses_read_back_as_written_and_refuse_an_index_outside_the_list()
    {
        long lo = OpenedMicros + 500_000;
        byte[] log = TestFrames.Concat(
            TestFrames.Encode(FrameType.Configuration, 1, BodyBuilder.Configuration().ToArray()),
            Pulses(2, count: 7, lo: lo, width: 1),
            Pulses(3, count: 9, lo: lo + 3_000, width: 2_000),
            Pulses(4, count: 9, lo: lo + 6_000, width: 10));

        DecodedRun run = Assert.Single(LogReader.Read(log, "packed.log").Runs);

        Assert.Equal([new PulseRecord(7, lo / 1e6, (lo + 1) / 1e6), new PulseRecord(9, (lo + 3_000) / 1e6, (lo + 5_000) / 1e6)], run.Pulses);
        Assert.Equal(run.Pulses, run.Pulses.ToArray());
        Assert.Throws<ArgumentOutOfRangeException>(() => run.Pulses[2]);
        Assert.Throws<ArgumentOutOfRangeException>(() => run.Pulses[-1]);
        Assert.Contains(run.Warnings, w => w.StartsWith("1 pulse observation(s) of channel 0 repeated or went back", StringComparison.Ordinal));
    }

    private static byte[] AccelerationFrame(int sequence, long readMicros, long first, int count)
    {
        var body = new BodyBuilder().Varint(readMicros).Varint(first).Varint(count);
        for (long i = first; i < first + count; i++)
        {
            body.Int16((short)i).Int16((short)(100 + i)).Int16(1000);
        }

        return TestFrames.Encode(FrameType.Acceleration, sequence, body.ToArray());
    }

    private static byte[] Pulses(int sequence, long count, long lo, long width) =>
        TestFrames.Encode(FrameType.Pulses, sequence, new BodyBuilder().Byte(0).Varint(1).Varint(count).Varint(lo).Varint(width).ToArray());

    private static byte[] Configuration(int pulsesPerRevolution, long circumferenceMicrometres) =>
        new BodyBuilder()
            .Byte(LogFormat.Version).Byte(0).Byte(1).Byte(2)
            .Varint(3).Varint(OpenedMicros).Varint(1000)
            .Byte(LogFormat.ConfigFlagAccelerometer | LogFormat.ConfigFlagStaged)
            .Varint(pulsesPerRevolution).Varint(circumferenceMicrometres)
            .Varint(304_800).Varint(1_000_000).Varint(8000).Byte(1).Byte(0)
            .Varint(1500).Varint(1_000_000).Varint(60).Varint(40).Varint(16).Varint(2_000_000).Varint(2000).ToArray();
}
