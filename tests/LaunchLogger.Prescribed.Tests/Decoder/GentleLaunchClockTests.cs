using System.Globalization;
using System.Text.RegularExpressions;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A minute at rest, then a gentle launch (0.25–0.35 g reached in 0.15–0.35 s, falling
/// toward 0.1 g over 12 s, then a stop), written as CSV files by an accelerometer whose clock runs
/// 60–100 ppm fast or slow and whose axes carry 250 µg/√Hz of white noise. Nothing ties the
/// file's times to the pulses', so by the launch its axis stands drift × 60 s (3.6–6 ms) from
/// theirs, and the decoder matches the two over the launch. The truth of that offset is the
/// generator's: sample i is taken at i·(1 − drift)/rate and stamped i/rate, so at first motion
/// t₀ the file's time is t₀ + drift·t₀ (<see cref="Sensors.AccelSensor"/>).
/// A gentle launch is where the match was worst: the body-pitch compensation passes the vertical
/// axis' noise into the forward input at a gain of up to g/(2·0.5 m/s²) where the acceleration is
/// small, and the match read it as clock offset (3–4 ms off on such launches).</summary>
public class GentleLaunchClockTests
{
    private const double G = TruthUnits.StandardGravity;

    private static readonly int[] SeedList = [21, 22, 23, 24, 25, 26, 27, 28];

    public static TheoryData<int> Seeds => new(SeedList);

    [Theory]
    [MemberData(nameof(Seeds))]
    public void The_clock_offset_at_a_gentle_launch_lies_within_three_sigma(int seed)
    {
        (PrescribedRecord r, double truthOffsetS) = Record(seed);
        (double offsetS, double sigmaS) = MatchedOffset(r);
        Assert.True(Math.Abs(offsetS - truthOffsetS) <= (3 * sigmaS) + 5e-5, FormattableString.Invariant($"{r.Spec}: δ {offsetS * 1e3:F1} ms ± {sigmaS * 1e3:F1}, truth {truthOffsetS * 1e3:F2} ms"));
    }

    [Fact]
    public void The_clock_offset_at_gentle_launches_is_matched_to_within_a_quarter_of_the_slide()
    {
        // Measured on these eight records: rms error 2.64 ms (six of eight 1.5–4.1 ms off) while
        // the match read the pitch-compensated input, 1.09 ms (largest 2.15 ms) since it reads
        // the forward axis as it is. The slides are 3.7–5.8 ms; 1.5 ms is a quarter of the largest.
        var errors = new List<string>();
        double sum = 0;
        foreach (int seed in SeedList)
        {
            (PrescribedRecord r, double truthOffsetS) = Record(seed);
            (double offsetS, double sigmaS) = MatchedOffset(r);
            double error = offsetS - truthOffsetS;
            sum += error * error;
            errors.Add(FormattableString.Invariant($"seed {seed}: {error * 1e3:+0.00;-0.00} ms (σ {sigmaS * 1e3:F1})"));
        }

        double rms = Math.Sqrt(sum / errors.Count);
        Assert.True(rms <= 1.5e-3, FormattableString.Invariant($"rms {rms * 1e3:F2} ms: {string.Join(", ", errors)}"));
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void First_motion_after_a_gentle_launch_from_files_lies_within_three_sigma(int seed)
    {
        (PrescribedRecord r, _) = Record(seed);
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);
        FigureCheck check = new("first motion", a.Figures.FirstMotionS.Value, a.Figures.FirstMotionS.Sigma, t.FirstMotionS!.Value, double.PositiveInfinity, 2e-4);
        Assert.True(check.Failure is null, $"{r.Spec}: {check.Failure}");
    }

    /// <summary>The offset the decoder matched (δ = file time − pulse time; it moves the samples
    /// by −δ and prints that to 0.1 ms) and its σ.</summary>
    private static (double OffsetS, double SigmaS) MatchedOffset(PrescribedRecord r)
    {
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        string matched = Assert.Single(a.Reconstruction.Warnings, w => w.Contains("clock was matched", StringComparison.Ordinal));
        Match m = Regex.Match(matched, @"moved by (-?[0-9.]+) ms ± ([0-9.]+)");
        Assert.True(m.Success, matched);
        return (-double.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture) * 1e-3, double.Parse(m.Groups[2].Value, CultureInfo.InvariantCulture) * 1e-3);
    }

    private static (PrescribedRecord Record, double TruthOffsetS) Record(int seed)
    {
        var random = new Random(seed);
        double peak = G * (0.25 + (0.1 * random.NextDouble()));
        double rise = 0.15 + (0.2 * random.NextDouble());
        double drift = (random.NextDouble() < 0.5 ? -1 : 1) * (60 + (40 * random.NextDouble()));
        MotionProfile profile = new MotionProfileBuilder()
            .Hold(60)
            .Ramp(rise, 0, peak)
            .Exponential(12, peak, 0.1 * G, 4 + (6 * random.NextDouble()))
            .Hold(0.5)
            .BrakeToStop(0.3, 0.7 * G)
            .Hold(PrescribedShapes.RestAfterS)
            .Build();
        var shape = new Shape(FormattableString.Invariant($"60 s idle, then a gentle launch, {peak / G:0.00} g in {rise:0.00} s"), ShapeKind.LongIdle, profile);
        PrescribedRecordSpec spec = Records.Standing(seed, spinUp: true) with { Shape = shape };
        spec = spec with { Accel = spec.Accel! with { ClockDriftPpm = drift, NoiseMicroGPerRootHz = 250 } };
        PrescribedRecord record = spec.Generate();
        double firstMotion = Assert.Single(record.Truth).FirstMotionS!.Value;
        return (record, drift * 1e-6 * (firstMotion - spec.Accel!.FirstSampleS));
    }
}
