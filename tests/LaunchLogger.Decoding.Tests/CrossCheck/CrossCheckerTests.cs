using System.Globalization;
using System.Text;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.CrossCheck;

/// <summary>One simulated drive recorded twice: by the box (our log) and by a satellite receiver
/// writing NMEA 0183 at 10 or 20 Hz on its own clock, with speed and position noise. The receiver's
/// record is written from the simulator's truth, not from our reconstruction.</summary>
public sealed class CrossCheckerTests
{
    // Their clock reads ours plus this (so our time = theirs + OffsetS with OffsetS = −this).
    private const double TheirClockAheadS = 43_000.0371;
    // The tyre is taken as calibrated at speed (no growth), so that our figures are as good as
    // our σ says and the comparison tests the cross-check itself.
    private static readonly Lazy<SimulationResult> Drive = new(() =>
    {
        Scenario s = BuiltInScenarios.Default;
        return Simulator.Run(s with { Tyre = s.Tyre with { RadiusGrowthAt30Mps = 0 } }, seed: 12);
    });
    private static readonly Lazy<RunAnalysis> Ours = new(() =>
        RunAnalyzer.Analyze(LogReader.Read(Drive.Value.LogBytes, "drive.log").Runs[0]));

    [Theory]
    [InlineData(10, 1)]
    [InlineData(20, 2)]
    public void The_clock_offset_is_recovered_and_every_figure_agrees_within_the_combined_uncertainty(int rateHz, int seed)
    {
        SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(Receiver(Drive.Value.Truth, rateHz, seed)), "receiver.nmea");
        CrossCheckResult result = CrossChecker.Compare(Ours.Value, theirs, speedSigmaMps: 0.05);

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

    /// <summary>GGA, RMC and VTG each epoch; speed noise 0.05 m/s, positions with 0.5 m noise
    /// along a straight strip heading north-east; one sentence in 40 damaged.</summary>
    private static string Receiver(Trajectory truth, int rateHz, int seed)
    {
        var random = new Random(seed);
        var text = new StringBuilder();
        double period = 1.0 / rateHz;
        double firstTheirs = Math.Ceiling((truth.TimeS[0] + TheirClockAheadS) * rateHz) / rateHz;
        double lastTheirs = truth.TimeS[^1] + TheirClockAheadS;
        const double lat0 = 48.1, lon0 = 11.5, heading = Math.PI / 4;
        int line = 0;
        for (int k = 0; firstTheirs + (k * period) <= lastTheirs; k++)
        {
            double theirsS = Math.Round((firstTheirs + (k * period)) * rateHz) / rateHz;
            double oursS = theirsS - TheirClockAheadS;
            double speed = Math.Max(0, truth.ValueAt(truth.SpeedMps, oursS) + (0.05 * Gaussian(random)));
            double along = truth.ValueAt(truth.DistanceM, oursS);
            double north = (along * Math.Cos(heading)) + (0.5 * Gaussian(random));
            double east = (along * Math.Sin(heading)) + (0.5 * Gaussian(random));
            double lat = lat0 + (north / GeoProjection.EarthRadiusM * 180 / Math.PI);
            double lon = lon0 + (east / (GeoProjection.EarthRadiusM * Math.Cos(lat0 * Math.PI / 180)) * 180 / Math.PI);
            int h = (int)(theirsS / 3600) % 24;
            int m = (int)(theirsS / 60) % 60;
            double s = theirsS % 60;
            string clock = string.Create(CultureInfo.InvariantCulture, $"{h:00}{m:00}{s:00.00}");
            string position = string.Create(CultureInfo.InvariantCulture, $"{(int)lat:00}{(lat - (int)lat) * 60:00.000000},N,{(int)lon:000}{(lon - (int)lon) * 60:00.000000},E");
            double knots = speed * 3600 / 1852;
            string[] sentences =
            [
                Nmea.Sentence($"GNGGA,{clock},{position},1,12,0.8,500.0,M,47.0,M,,"),
                Nmea.Sentence(string.Create(CultureInfo.InvariantCulture, $"GNRMC,{clock},A,{position},{knots:0.000},45.0,030326,,,A")),
                Nmea.Sentence(string.Create(CultureInfo.InvariantCulture, $"GNVTG,45.0,T,,M,{knots:0.000},N,{speed * 3.6:0.000},K,A")),
            ];
            foreach (string sentence in sentences)
            {
                // Damage a GGA now and then (never the speed sentences, so every epoch keeps a speed).
                bool damage = sentence.StartsWith("$GNGGA", StringComparison.Ordinal) && ++line % 40 == 0;
                text.Append(damage ? sentence.Replace(",1,12,", ",1,13,", StringComparison.Ordinal) : sentence).Append('\n');
            }
        }

        return text.ToString();
    }

    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
