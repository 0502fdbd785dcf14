using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Reading;
using LaunchLogger.Decoding.Tests.Runs.Support;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation.Box;
using LaunchLogger.Tests.Shared;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>Bench rests written by the firmware core (LOG-FORMAT.md, 0x09 and 0x0A) are read as
/// rests, apart from the runs.</summary>
public class BenchRestReadingTests
{
    private const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)

    [Fact]
    public void Two_rests_are_read_as_rests_with_their_samples_and_no_run()
    {
        byte[] log = BenchRestLogs.Write(1, new BenchRestLogs.Rest(9.9), new BenchRestLogs.Rest(-9.7));

        LogReadResult read = LogReader.Read(log, "bench.log");

        Assert.Empty(read.Runs);
        Assert.Empty(read.Warnings);
        Assert.False(read.Stats.HasDamage);
        Assert.Equal(2, read.BenchRests.Count);
        double[] levels = [9.9, -9.7];
        for (int i = 0; i < 2; i++)
        {
            BenchRestRecord rest = read.BenchRests[i];
            Assert.Equal(i + 1, rest.Number);
            Assert.Equal($"bench.log rest {i + 1}", rest.Source);
            Assert.Equal(BenchRestOutcome.Complete, rest.Outcome);
            Assert.Empty(rest.Warnings);
            Assert.Equal(20.0, rest.LengthS);
            Assert.InRange(rest.EndedS!.Value - rest.OpenedS, 20.0, 20.03);
            Assert.InRange(rest.Count, 19_980, 20_020);
            Assert.Equal(1000.0, rest.RateHz);

            // Indices follow on without a hole; the forward mean is the level written (noise σ 5 mg).
            for (int k = 1; k < rest.Count; k++)
            {
                Assert.Equal(rest.SampleIndex[k - 1] + 1, rest.SampleIndex[k]);
            }

            (double[] time, double[] forward) = rest.Forward();
            Assert.Equal(0, time[0]);
            Assert.Equal((rest.Count - 1) / 1000.0, time[^1], 9);
            Assert.InRange(forward.Average(), levels[i] - (0.2e-3 * G0), levels[i] + (0.2e-3 * G0));
        }
    }

    [Fact]
    public void A_rest_a_pulse_spoiled_is_read_as_spoiled_where_it_ended()
    {
        byte[] log = BenchRestLogs.Write(2, new BenchRestLogs.Rest(9.8, PulseAtS: 5));

        BenchRestRecord rest = Assert.Single(LogReader.Read(log, "moved.log").BenchRests);

        Assert.Equal(BenchRestOutcome.SpoiledByPulse, rest.Outcome);
        Assert.InRange(rest.EndedS!.Value - rest.OpenedS, 5.0, 5.03);
        Assert.InRange(rest.Count, 4_980, 5_040);
    }

    [Fact]
    public void A_rest_cut_off_by_the_end_of_the_log_is_kept_as_unfinished()
    {
        byte[] log = BenchRestLogs.Write(3, new BenchRestLogs.Rest(9.8), new BenchRestLogs.Rest(-9.8));

        LogReadResult read = LogReader.Read(log.AsSpan(0, log.Length - 60_000), "cut.log");

        Assert.Equal(2, read.BenchRests.Count);
        Assert.Equal(BenchRestOutcome.Complete, read.BenchRests[0].Outcome);
        BenchRestRecord cut = read.BenchRests[1];
        Assert.Equal(BenchRestOutcome.Unfinished, cut.Outcome);
        Assert.Null(cut.EndedS);
        Assert.Contains(cut.Warnings, w => w.Contains("log ends before the rest's end", StringComparison.Ordinal));
    }

    [Fact]
    public void A_rest_that_never_ends_keeps_no_more_samples_than_its_set_length_allows()
    {
        // A damaged log: a 1-s rest at 100 Hz opens, then 2,000 samples and no end frame.
        var frames = new List<byte[]>
        {
            TestFrames.Encode(FrameType.BenchRest, 1, new BodyBuilder().Varint(1).Varint(5_000_000).Varint(1_000_000).Varint(100_000).Varint(4_000).Byte(2).Byte(0).ToArray()),
        };
        for (int f = 0; f < 20; f++)
        {
            var body = new BodyBuilder().Varint(5_000_000 + ((f + 1) * 1_000_000L)).Varint(f * 100L).Varint(100);
            for (int i = 0; i < 100; i++)
            {
                body.Int16(0).Int16(0).Int16(1000);
            }

            frames.Add(TestFrames.Encode(FrameType.Acceleration, f + 2, body.ToArray()));
        }

        BenchRestRecord rest = Assert.Single(LogReader.Read(TestFrames.Concat([.. frames]), "endless.log").BenchRests);

        // 1 s × 100 Hz with a tenth to spare, and 1,024 more: 1,134 kept, 866 said.
        Assert.Equal(BenchRestOutcome.Unfinished, rest.Outcome);
        Assert.Equal(1_134, rest.Count);
        Assert.Contains(rest.Warnings, w => w.StartsWith("866 samples beyond the rest's set length (1 s) left out", StringComparison.Ordinal));
    }

    [Fact]
    public void A_run_before_a_rest_reads_as_without_it_and_the_streamed_reader_hands_the_rests_over_at_the_end()
    {
        var driver = new LaunchDriver(new LoggerSettings());
        driver.Run(accelerateUntilMicros: 7_000_000, endMicros: 10_000_000);
        byte[] runLog = driver.Sink.ToArray();
        byte[] joined = [.. runLog, .. BenchRestLogs.Write(4, new BenchRestLogs.Rest(9.8))];

        LogReadResult alone = LogReader.Read(runLog, "box.log");
        LogReadResult both = LogReader.Read(joined, "box.log");
        LogReadResult? streamedEnd = null;
        var streamed = LogReader.ReadRuns(new MemoryStream(joined), "box.log", r => streamedEnd = r).ToList();

        Assert.Equal(RunFingerprint.Of(Assert.Single(alone.Runs)), RunFingerprint.Of(Assert.Single(both.Runs)));
        Assert.Equal(RunFingerprint.Of(Assert.Single(alone.Runs)), RunFingerprint.Of(Assert.Single(streamed)));
        Assert.Single(both.BenchRests);
        Assert.Equal("box.log (after restart 1) rest 1", Assert.Single(streamedEnd!.BenchRests).Source);
        Assert.DoesNotContain(both.Warnings, w => w.Contains("outside any run", StringComparison.Ordinal));
    }
}
