using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Output;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Tests.Decoder;
using LaunchLogger.Prescribed.Truth;
using Xunit.Abstractions;

namespace LaunchLogger.Prescribed.Tests.CrossCheck;

/// <summary>The cross-check with truth from outside the simulator: one generated drive recorded by
/// the box (the firmware core writes the log) and by a satellite receiver writing NMEA 0183 from
/// the same exact trajectory on its own clock (<see cref="NmeaTrace"/>). The clock offset is
/// recovered, every row agrees within the combined uncertainty (the cross-check's own claim), and
/// each side of every row — ours and theirs — lies within 3σ of the generator's truth.</summary>
public class PrescribedCrossCheckTests(ITestOutputHelper output)
{
    private const double TimeFloorS = 2e-4;
    private const double SpeedFloorMps = 2e-3;

    /// <summary>Standing starts of <see cref="Records.Standing"/> (8 to 100 teeth, 100 to 1600 Hz,
    /// launches rising over 0.05–0.4 s), alternately at 10 and 20 epochs per second.</summary>
    private static readonly (int Seed, double RateHz)[] Drives =
        Enumerable.Range(1, 12).Select(seed => (seed, seed % 2 == 0 ? 20.0 : 10.0)).ToArray();

    [Fact]
    public void Generated_drives_cross_check_within_the_combined_uncertainty_and_both_sides_cover_the_truth()
    {
        var failures = new List<string>();
        var rows = new Tally("rows, |theirs − ours| within 2σc and 3σc");
        var oursTally = new Tally("ours − truth within 2σ and 3σ");
        var theirsTally = new Tally("theirs − truth within 2σ and 3σ");
        var offsetZ = new List<double>();
        var offsets = new List<string>();
        foreach ((int seed, double rateHz) in Drives)
        {
            PrescribedRecord record = Records.Standing(seed).Generate();
            RunAnalysis ours = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs);
            TruthRun truth = Assert.Single(record.Truth);
            var receiver = new NmeaTrace { RateHz = rateHz };
            SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(receiver.Write(record.Spec.Shape.Profile, seed)), "receiver.nmea");
            Assert.Equal(0, theirs.RecordsRejected);
            CrossCheckResult result = CrossChecker.Compare(ours, theirs, speedSigmaMps: receiver.SpeedNoiseMps);
            string what = Invariant($"seed {seed} ({record.Spec.Pickup.Teeth} teeth, {rateHz:0} Hz)");
            Assert.Equal(rateHz, result.SampleRateHz, 6);

            // Our clock = theirs − ClockAheadS. With 24 teeth or more within the simulated
            // cross-check's 5 ms goal (12 teeth: 5.9 ms on seed 7); every one counts in the
            // spread of the offset's errors in units of its σ, checked below.
            double offsetError = result.Alignment.OffsetS + receiver.ClockAheadS;
            offsetZ.Add(offsetError / result.Alignment.OffsetSigmaS);
            offsets.Add(Invariant($"{what} {offsetError * 1000:0.00} ms (σ {result.Alignment.OffsetSigmaS * 1000:0.00})"));
            if (record.Spec.Pickup.Teeth >= 24 && Math.Abs(offsetError) > 0.005)
            {
                failures.Add(Invariant($"{what}: clock offset error {offsetError * 1000:0.00} ms beyond the 5 ms goal"));
            }

            int compared = 0;
            foreach (CrossCheckRow row in result.Rows)
            {
                rows.Add(Math.Abs(row.Difference), row.CombinedSigma, 0, $"{what} {row.Figure} {row.Convention}: theirs − ours {row.Difference:0.0000}, σc {row.CombinedSigma:0.0000}");
                if (TruthOf(row, ours.Figures, truth) is not { } exact)
                {
                    continue;
                }

                compared++;
                double floor = row.Unit == "m/s" ? SpeedFloorMps : TimeFloorS;
                oursTally.Add(Math.Abs(row.Ours - exact), row.OursSigma, floor, $"{what} {row.Figure} {row.Convention}: ours − truth {row.Ours - exact:0.0000}, σ {row.OursSigma:0.0000}");
                theirsTally.Add(Math.Abs(row.Theirs - exact), row.TheirsSigma, floor, $"{what} {row.Figure} {row.Convention}: theirs − truth {row.Theirs - exact:0.0000}, σ {row.TheirsSigma:0.0000}");
            }

            // First motion, 0-60 mph both ways, 60 ft and the quarter mile both ways and its trap at least.
            if (compared < 8)
            {
                failures.Add($"{what}: only {compared} rows had a truth to compare with");
            }
        }

        // A 2σ band claims 95.4 % and a 3σ band 99.7 % (normal distribution); over about 250
        // rows per tally, at least 93 % and 99 % leave room for sampling (common practice).
        foreach (Tally tally in new[] { rows, oursTally, theirsTally })
        {
            output.WriteLine(Invariant($"{tally.Name}: {tally.Within2} and {tally.Within3} of {tally.Count}; outside 3σ: {string.Join("; ", tally.Outside3)}"));
            if (tally.Within2 < 0.93 * tally.Count || tally.Within3 < 0.99 * tally.Count)
            {
                failures.Add(Invariant($"{tally.Name}: {tally.Within2} and {tally.Within3} of {tally.Count}; outside 3σ: {string.Join("; ", tally.Outside3)}"));
            }
        }

        // The offset's σ is right when its errors in units of σ have unit spread: Σz² follows a
        // χ² law with one degree of freedom per drive, so its 99th percentile (the χ²
        // distribution, as MathNet.Numerics computes it) bounds it. Measured over 40 receivers
        // each on two records at 10 and 20 Hz: rms z 0.80–1.27, no bias (mean within ±0.2 ms).
        double chi2 = offsetZ.Sum(z => z * z);
        double chi2Limit = MathNet.Numerics.Distributions.ChiSquared.InvCDF(offsetZ.Count, 0.99);
        output.WriteLine(Invariant($"clock offsets: Σz² {chi2:0.0} (99th percentile {chi2Limit:0.0}): {string.Join("; ", offsets)}"));
        if (chi2 > chi2Limit)
        {
            failures.Add(Invariant($"clock offsets spread more than their σ: Σz² {chi2:0.0} over {offsetZ.Count} drives beyond {chi2Limit:0.0}: {string.Join("; ", offsets)}"));
        }

        Assert.True(failures.Count == 0, string.Join("\n", failures));
        Assert.True(rows.Count >= 12 * 8, $"{rows.Count} rows");
    }

    [Theory]
    [InlineData(0.25, 0.4, 10)]
    [InlineData(0.25, 0.4, 20)]
    [InlineData(0.4, 0.3, 20)]
    [InlineData(0.9, 0.05, 10)]
    public void The_receivers_start_covers_a_launch_that_builds_slowly_or_at_once(double peakG, double riseS, double rateHz)
    {
        // The acceleration rises at a steady rate to its peak, holds for 8 s, then the car stops:
        // at 0.25 g over 0.4 s the speed stays below the receiver's 0.05 m/s noise for 0.13 s
        // (v = a·t²/(2·rise)), so the last sample that reads at rest comes after the start.
        double a = peakG * 9.80665;
        var shape = new Shape(Invariant($"{peakG} g building over {riseS} s"), ShapeKind.StandingStart,
            new MotionProfileBuilder().Hold(2).Ramp(riseS, 0, a).Constant(8, a).BrakeToStop(0.2, 0.8 * 9.80665).Hold(3).Build());
        PrescribedRecord record = (Records.Standing(4) with { Shape = shape }).Generate();
        RunAnalysis ours = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs);
        var receiver = new NmeaTrace { RateHz = rateHz };
        SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(receiver.Write(shape.Profile, 7)), "receiver.nmea");
        CrossCheckRow start = CrossChecker.Compare(ours, theirs, receiver.SpeedNoiseMps).Rows[0];

        double truth = Assert.Single(record.Truth).FirstMotionS!.Value;
        Assert.True(Math.Abs(start.Theirs - truth) <= 2 * start.TheirsSigma, Invariant($"{shape.Name} at {rateHz} Hz: their start {start.Theirs - truth:0.000} s from the truth, σ {start.TheirsSigma:0.000} s"));
        Assert.True(start.WithinUncertainty, Invariant($"{shape.Name}: theirs − ours {start.Difference:0.000} s, σc {start.CombinedSigma:0.000} s"));
    }

    [Fact]
    public void The_receivers_sentences_carry_valid_checksums_and_the_hemisphere_letters()
    {
        // NMEA 0183 checksum by hand for a short body: 'G' ^ 'P' = 0x17 (0x47 ^ 0x50).
        Assert.Equal("$GP*17", NmeaTrace.Sentence("GP"));

        PrescribedRecord record = Records.Standing(2).Generate();
        string nmea = new NmeaTrace { RateHz = 10 }.Write(record.Spec.Shape.Profile, 1);
        string[] lines = nmea.Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.All(lines, line => Assert.True(NmeaSentence.TryParse(line, out _), line));
        Assert.All(lines.Where(l => l.StartsWith("$GPGGA", StringComparison.Ordinal)), l => Assert.Matches(@",\d{4}\.\d{5},S,\d{5}\.\d{5},W,", l));

        // One GGA, RMC and VTG per epoch, from the first whole tenth of the receiver's clock to
        // the record's end.
        double end = record.Spec.Shape.Profile.EndS;
        int epochs = lines.Count(l => l.StartsWith("$GPRMC", StringComparison.Ordinal));
        Assert.Equal(3 * epochs, lines.Length);
        Assert.InRange(epochs, (int)Math.Floor(end * 10) - 1, (int)Math.Ceiling(end * 10) + 1);
    }

    /// <summary>The generator's exact value of a cross-check row, or null for a row the truth does
    /// not hold (a figure the run did not reach, an interval ending within 2 % of the top speed,
    /// where timing says nothing — see <see cref="FigureChecks.Passing"/>).</summary>
    private static double? TruthOf(CrossCheckRow row, FigureSet figures, TruthRun truth)
    {
        if (row.Figure.StartsWith("first motion", StringComparison.Ordinal))
        {
            return truth.FirstMotionS;
        }

        if (figures.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == row.Figure) is { } interval)
        {
            if (interval.Interval.ToMps >= 0.98 * truth.PeakSpeedMps)
            {
                return null;
            }

            TruthInterval? t = truth.Interval(new TruthSpeedSpan(interval.Interval.FromMps, interval.Interval.ToMps));
            return row.Convention == "rollout" ? t?.FromRolloutS : t?.FromStandstillS;
        }

        bool trap = row.Figure.EndsWith(" trap", StringComparison.Ordinal);
        string label = trap ? row.Figure[..^" trap".Length] : row.Figure;
        if (figures.DistanceMarks.FirstOrDefault(m => m.Mark.Label == label) is { } mark && truth.Mark(mark.Mark.DistanceM) is { } exact)
        {
            return trap ? exact.TrapSpeedMps : row.Convention == "rollout" ? exact.FromRolloutS : exact.FromStandstillS;
        }

        return null;
    }

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);

    /// <summary>How many errors fall within 2σ and 3σ (or a numerical floor), with the misses
    /// beyond 3σ described.</summary>
    private sealed class Tally(string name)
    {
        public string Name => name;

        public int Count { get; private set; }

        public int Within2 { get; private set; }

        public int Within3 { get; private set; }

        public List<string> Outside3 { get; } = [];

        public void Add(double error, double sigma, double floor, string description)
        {
            Count++;
            Within2 += error <= Math.Max(2 * sigma, floor) ? 1 : 0;
            if (error <= Math.Max(3 * sigma, floor))
            {
                Within3++;
            }
            else
            {
                Outside3.Add(description);
            }
        }
    }
}
