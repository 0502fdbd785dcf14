using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Decoding.Tests.CrossCheck;

/// <summary>One simulated drive recorded twice: by the box (our log) and by a satellite receiver
/// writing NMEA 0183 at 10 or 20 Hz on its own clock, with speed noise 0.05 m/s, position noise
/// 0.5 m and one GGA in 40 damaged. The receiver's record is written from the simulator's truth,
/// not from our reconstruction.</summary>
public sealed class CrossCheckerTests
{
    // Their clock reads ours plus this (so our time = theirs + OffsetS with OffsetS = −this).
    private const double TheirClockAheadS = 43_000.0371;
    // The tyre grows with speed and is not calibrated at speed, as on a club day: our σ carries
    // it (`bench crosscheck` measures coverage over many drives).
    private static readonly Lazy<SimulationResult> Drive = new(() => Simulator.Run(BuiltInScenarios.Default, seed: 12));
    private static readonly Lazy<RunAnalysis> Ours = new(() =>
        RunAnalyzer.Analyze(LogReader.Read(Drive.Value.LogBytes, "drive.log").Runs[0]));

    [Theory]
    [InlineData(10, 1)]
    [InlineData(20, 2)]
    public void The_clock_offset_is_recovered_and_every_figure_agrees_within_the_combined_uncertainty(int rateHz, int seed)
    {
        string nmea = new SatelliteReceiver { RateHz = rateHz, ClockAheadS = TheirClockAheadS, DamageEveryGga = 40 }.WriteNmea(Drive.Value.Truth, seed);
        SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(nmea), "receiver.nmea");
        CrossCheckResult result = CrossChecker.Compare(Ours.Value, theirs, speedSigmaMps: 0.05);

        Assert.True(result.RecordsRejected > 0, "the damaged GGA sentences are counted");

        // Goal: the offset within 5 ms of the truth.
        Assert.InRange(result.Alignment.OffsetS - (-TheirClockAheadS), -0.005, 0.005);
        Assert.True(result.Alignment.OffsetSigmaS < 0.005, $"offset σ {result.Alignment.OffsetSigmaS * 1000:0.0} ms");

        Assert.Contains(result.Rows, r => r.Figure == "0-60 mph" && r.Convention == "standstill");
        Assert.Contains(result.Rows, r => r.Figure == "1320 ft (1/4 mile) trap");
        CrossCheckRow[] outside = result.Rows.Where(r => !r.WithinUncertainty).ToArray();
        Assert.True(outside.Length == 0, string.Join("; ", outside.Select(r =>
            string.Create(CultureInfo.InvariantCulture, $"{r.Figure} {r.Convention}: ours {r.Ours:0.0000} theirs {r.Theirs:0.0000} diff {r.Difference:0.0000} σc {r.CombinedSigma:0.0000}"))));

        // A 10 Hz trace cannot see the first foot: its start carries at least a period's uniform σ.
        CrossCheckRow start = result.Rows.Single(r => r.Figure == "0-60 mph" && r.Convention == "standstill");
        Assert.True(start.TheirsSigma >= 1 / Math.Sqrt(12) / rateHz, $"their 0-60 σ {start.TheirsSigma:0.000} s at {rateHz} Hz");
        Assert.Equal(rateHz, result.SampleRateHz, 6);
    }

    [Fact]
    public void A_record_that_misses_the_run_is_a_clear_error()
    {
        string text = string.Join('\n', Enumerable.Range(0, 50).Select(k =>
            Nmea.Sentence(string.Create(CultureInfo.InvariantCulture, $"GPRMC,0100{k / 10:00}.{k % 10}0,A,4807.0000,N,01131.0000,E,0.000,0.0,030326,,,A"))));
        SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(text), "short.nmea");
        var e = Assert.Throws<LaunchLogger.Decoding.Import.InputException>(() => CrossChecker.Compare(Ours.Value, theirs));
        Assert.Contains("does not cover the whole run", e.Message, StringComparison.Ordinal);
    }
}
