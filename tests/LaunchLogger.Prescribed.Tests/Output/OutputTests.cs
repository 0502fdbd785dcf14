using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Prescribed.Tests.Output;

/// <summary>The generator's CSV text and logs read back by the product's own readers.</summary>
public class OutputTests
{
    private static PrescribedRecordSpec Spec() => new() { Shape = PrescribedShapes.ConstantLaunch(4), Pickup = new WheelPickup(36, TyreModel.Calibrated(1.95)), Seed = 2 };

    [Fact]
    public void Edge_and_accelerometer_csv_read_back_as_written()
    {
        PrescribedRecord r = Spec().Generate();
        IReadOnlyList<PulseRecord> edges = EdgeFile.Read(new StringReader(r.PulsesCsv), "edges.csv");
        Assert.Equal(r.ObservedEdgesS.Length, edges.Count);
        Assert.Equal(r.ObservedEdgesS[^1], edges[^1].LoS);
        AccelSeries accel = AccelFile.Read(new StringReader(r.AccelCsv!), "accel.csv");
        Assert.Equal(r.AccelSamples!.Length, accel.TimeS.Length);
        Assert.Equal(1 / 400.0, accel.SamplePeriodS, 9);
    }

    [Fact]
    public void Count_csv_reads_back_with_the_counter_origin_told_apart()
    {
        PrescribedRecord r = (Spec() with { Polled = new PolledCounter(2e-3, 0.2, 2, 0.01) }).Generate();
        IReadOnlyList<PulseRecord> pulses = CountFile.Read(new StringReader(r.PulsesCsv), "counts.csv");
        Assert.Equal(r.TrueEdgesS.Length, pulses[^1].Count);
        Assert.All(pulses, p => Assert.True(r.TrueEdgesS[p.Count - 1] > p.LoS && r.TrueEdgesS[p.Count - 1] <= p.HiS));
    }

    [Fact]
    public void A_log_written_by_the_firmware_core_holds_the_run_and_its_pulses()
    {
        PrescribedRecord r = Spec().Generate();
        LogReadResult log = LogReader.Read(r.ToLog(), "generated");
        DecodedRun run = Assert.Single(log.Runs);
        Assert.Equal(0, log.Stats.CrcErrors);
        Assert.Equal(36, run.Configuration.PulsesPerRevolution);
        Assert.Equal(1.95 / 36, run.Configuration.MetresPerPulse, 9);
        Assert.True(run.Configuration.HasAccelerometer);

        // Every pulse after staging is in the run, stamped to the microsecond of the box's clock,
        // which reads the record's own time.
        Assert.Equal(r.TrueEdgesS.Length, run.Pulses[^1].Count - run.Pulses[0].Count + 1);
        Assert.Equal(Math.Ceiling(r.TrueEdgesS[^1] * 1e6) / 1e6, run.Pulses[^1].HiS, 6);
    }
}
