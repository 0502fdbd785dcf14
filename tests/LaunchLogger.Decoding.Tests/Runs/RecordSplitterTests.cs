using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>The splitter cuts a record at rests of 2 s or more without a pulse (the box's own
/// stop-hold default, LoggerSettings.StopHoldMicros) and leaves everything else whole.</summary>
public class RecordSplitterTests
{
    private const double Pitch = 0.05;

    [Fact]
    public void A_rest_between_two_drives_makes_two_runs_with_counts_from_the_rest()
    {
        // 100 pulses from 1 s, a 4 s rest, 150 pulses; accelerometer at 100 Hz throughout.
        PulseRecord[] pulses = [.. Drive(1.0, 1, 100), .. Drive(1.0 + 0.99 + 4, 101, 250)];
        DecodedRun record = Record(pulses, 0, 12);

        IReadOnlyList<DecodedRun> runs = RecordSplitter.Split(record);

        Assert.Equal(2, runs.Count);
        Assert.Equal(100, runs[0].Pulses.Count);
        Assert.Equal(150, runs[1].Pulses.Count);
        Assert.Equal(1, runs[1].Pulses[0].Count);
        Assert.Equal(150, runs[1].Pulses[^1].Count);

        // The cut lies in the middle of the rest, so each run keeps 2 s of it.
        double cut = 0.5 * (pulses[99].HiS + pulses[100].LoS);
        Assert.True(runs[0].Accel!.TimeS[^1] <= cut && runs[1].Accel!.TimeS[0] > cut);
        Assert.Equal(record.Accel!.Count, runs[0].Accel!.Count + runs[1].Accel!.Count);
        Assert.Equal(cut, runs[1].Configuration.OpenedS);
        Assert.Equal(2, runs[1].Configuration.RunNumber);
    }

    [Fact]
    public void A_pause_shorter_than_the_box_s_stop_hold_keeps_one_run()
    {
        PulseRecord[] pulses = [.. Drive(1.0, 1, 100), .. Drive(1.0 + 0.99 + 1.9, 101, 150)];
        Assert.Single(RecordSplitter.Split(Record(pulses, 0, 8)));
    }

    [Fact]
    public void A_stray_pulse_while_parked_is_no_run_of_its_own()
    {
        // One pulse (the wheel rocking) 5 s before a drive of 200 pulses.
        PulseRecord[] pulses = [new PulseRecord(1, 1.0, 1.0001), .. Drive(6.0, 2, 200)];
        DecodedRun run = Assert.Single(RecordSplitter.Split(Record(pulses, 0, 12)));
        Assert.Equal(200, run.Pulses.Count);
    }

    /// <summary>Pulses every 10 ms with counts <paramref name="fromCount"/> to <paramref name="toCount"/>.</summary>
    private static IEnumerable<PulseRecord> Drive(double startS, long fromCount, long toCount) =>
        Enumerable.Range(0, (int)(toCount - fromCount + 1)).Select(i => new PulseRecord(fromCount + i, startS + (0.01 * i), startS + (0.01 * i) + 1e-6));

    private static DecodedRun Record(PulseRecord[] pulses, double fromS, double toS)
    {
        double[] t = Enumerable.Range(0, (int)((toS - fromS) * 100)).Select(i => fromS + (0.01 * i)).ToArray();
        return new DecodedRun
        {
            Source = "test",
            Configuration = new RunConfiguration { MetresPerPulse = Pitch, HasAccelerometer = true, AccelNominalRateHz = 100 },
            Pulses = pulses,
            Accel = new AccelSeries { TimeS = t, ForwardMps2 = new double[t.Length], LateralMps2 = new double[t.Length], VerticalMps2 = new double[t.Length], SamplePeriodS = 0.01 },
        };
    }
}
