using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Spin near standstill, judged on the generator's truth. A driven tyre passes its
/// largest force at a slip ratio of about 0.1–0.2 (J. Y. Wong, "Theory of Ground Vehicles",
/// ch. 1; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; from memory): a clean launch held at
/// that peak is valid, with no `wheelspin`; a wheel that runs away past it (<see cref="WheelSpin"/>,
/// a slip ratio of 0.3–1 for 0.1–0.5 s) makes the run doubtful for `wheelspin`, even when the
/// spin is over before the car reaches 1 m/s; an undriven wheel is never taken to spin.</summary>
public class LaunchSpinTests
{
    /// <summary>A driven tyre that slips by <paramref name="peakSlip"/> at the launch's peak
    /// acceleration, fading over <paramref name="fadeM"/> (1 m: a launch held near the tyre's grip
    /// peak over its first metres), on top of <see cref="DriveSlip"/>'s default linear part.</summary>
    internal static DriveSlip AtThePeak(PrescribedRecordSpec spec, double peakSlip, double fadeM = 1)
    {
        double peak = PeakAccelMps2(spec.Shape.Profile);
        const double linear = 0.003;
        return new DriveSlip(PerMps2: linear, LaunchPerMps2: (peakSlip / peak) - linear, LaunchFadeM: fadeM);
    }

    /// <summary>The standing start of <paramref name="seed"/> on a driven wheel (the default drive
    /// slip) that spins as <paramref name="spin"/> says.</summary>
    internal static PrescribedRecordSpec Spun(int seed, WheelSpin spin)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        return spec with { Pickup = spec.Pickup with { Slip = new DriveSlip(), Spin = spin } };
    }

    /// <summary>The largest acceleration over the first 3 s of motion, m/s².</summary>
    private static double PeakAccelMps2(MotionProfile profile)
    {
        double largest = 0;
        PlacedSegment first = profile.Segments.First(s => !s.AtRest);
        foreach (PlacedSegment s in profile.Segments.Where(s => !s.AtRest && s.StartS < first.StartS + 3))
        {
            for (int k = 0; k <= 200; k++)
            {
                largest = Math.Max(largest, s.SpeedAndAccelAt(s.DurationS * k / 200).AccelMps2);
            }
        }

        return largest;
    }

    /// <summary>How many teeth the spin puts the wheel ahead by. The case these tests are about is
    /// a lead of two teeth or more: a lead under a tooth, gained before the first edge, hides in the
    /// first tooth's unknown place, and no finder can see it.</summary>
    private static int TeethGained(PrescribedRecordSpec spec) =>
        spec.Pickup.EdgeTimes(spec.Shape.Profile).Length - (spec.Pickup with { Spin = null }).EdgeTimes(spec.Shape.Profile).Length;

    private static string Describe(Verdict verdict) => string.Join("; ", verdict.Reasons.Select(r => $"{r.Code}: {r.Text}"));

    internal static string Describe(RunAnalysis run) => Describe(run.Verdict!) + " | " + string.Join(" | ", run.Reconstruction.Warnings.Where(w => w.Contains("spin") || w.Contains("slid")));

    [Theory]
    [InlineData(1, 0.10)]
    [InlineData(2, 0.15)]
    [InlineData(3, 0.20)]
    [InlineData(4, 0.20)]
    [InlineData(6, 0.12)]
    [InlineData(7, 0.18)]
    [InlineData(8, 0.20)]
    [InlineData(9, 0.20)]
    public void A_clean_launch_at_the_tyres_grip_peak_is_valid(int seed, double peakSlip)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        spec = spec with { Pickup = spec.Pickup with { Slip = AtThePeak(spec, peakSlip) } };
        PrescribedRecord record = spec.Generate();
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(record).Runs);

        TruthRun truth = Assert.Single(record.Truth);
        Assert.NotNull(truth.Interval(TruthSpeedSpan.Mph(0, 60))?.FromStandstillS);
        Assert.True(run.Verdict!.Level == VerdictLevel.Valid, $"{spec}, slip {peakSlip}: {Describe(run)}");
        Assert.Empty(run.Reconstruction.WheelspinWindows);
        Assert.Empty(run.Reconstruction.LaunchSpinWindows);
    }

    [Theory]
    [InlineData(1, 0.15)]
    [InlineData(2, 0.20)]
    [InlineData(5, 0.20)]
    public void A_clean_launch_at_the_grip_peak_on_an_uncalibrated_tyre_and_accelerometer_is_valid(int seed, double peakSlip)
    {
        // The tyre rolls 0–2 % short of the circumference told and the accelerometer reads 1 % σ
        // off in scale, as on a box set up from a tyre's size: the pulses lead the accelerometer
        // by that much more at a launch already at the peak.
        (PrescribedRecordSpec spec, AnalysisOptions options, _) = Records.OffScaleTyre(Records.Standing(seed), new Random(seed));
        spec = spec with { Pickup = spec.Pickup with { Slip = AtThePeak(spec, peakSlip) } };
        options = options with { Calibration = null };
        PrescribedRecord record = spec.Generate();
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(record, options).Runs);
        Assert.DoesNotContain(run.Verdict!.Reasons, r => r.Code == "wheelspin");
        Assert.Empty(run.Reconstruction.WheelspinWindows);
        Assert.Empty(run.Reconstruction.LaunchSpinWindows);
    }

    /// <summary>Spins at the launch on wheels of 60–100 teeth that the 40-ms windows (from 1 m/s)
    /// miss: the decoder before the launch test called each of these valid.</summary>
    public static TheoryData<int, double, double, double> EarlySpins => new()
    {
        { 10, 0.03, 0.8, 0.20 },
        { 11, 0.00, 0.8, 0.15 },
        { 17, 0.00, 0.5, 0.20 },
    };

    [Theory]
    [MemberData(nameof(EarlySpins))]
    public void A_spin_near_standstill_makes_the_run_doubtful_for_wheelspin(int seed, double afterS, double slip, double holdS)
    {
        var spin = new WheelSpin(afterS, slip, 0.03, holdS, 0.05);
        PrescribedRecordSpec spec = Spun(seed, spin);
        Assert.True(TeethGained(spec) >= 2, $"{spec}, {spin}: the spin gained {TeethGained(spec)} teeth");
        PrescribedRecord record = spec.Generate();
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(record).Runs);

        Verdict verdict = run.Verdict!;
        Assert.True(verdict.Level >= VerdictLevel.Doubtful, $"{spec}, {spin}: {Describe(run)}");
        Assert.True(verdict.Reasons.Any(r => r.Code == "wheelspin"), $"{spec}, {spin}: {Describe(run)}");
    }

    [Theory]
    [InlineData(15)]
    [InlineData(16)]
    [InlineData(17)]
    [InlineData(21)]
    [InlineData(23)]
    [InlineData(27)]
    public void A_drawn_spin_is_found(int seed)
    {
        // Found by the 40-ms windows or by the launch test: most of these spins run on past
        // 1 m/s, where the windows see them (they did before the launch test too).
        WheelSpin spin = WheelSpin.Draw(new Random(seed));
        PrescribedRecordSpec spec = Spun(seed, spin);

        Assert.True(TeethGained(spec) >= 2, $"{spec}, {spin}: the spin gained {TeethGained(spec)} teeth");
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);
        Assert.True(run.Verdict!.Reasons.Any(r => r.Code == "wheelspin"), $"{spec}, {spin}: {Describe(run)}");
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(6)]
    public void An_undriven_wheel_is_never_taken_to_spin(int seed)
    {
        // A hard launch (up to 1.1 g) on an undriven wheel lagging the road as its tyre spins it
        // up (SpinUpLag): it falls behind the car, never ahead.
        PrescribedRecordSpec spec = Records.Standing(seed, spinUp: true);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);
        Assert.True(run.Verdict!.Level == VerdictLevel.Valid, $"{spec}: {Describe(run.Verdict)}");
        Assert.Empty(run.Reconstruction.WheelspinWindows);
        Assert.Empty(run.Reconstruction.LaunchSpinWindows);
    }
}
