using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A pickup on a driven wheel, whose tyre slips ahead of the car by several per cent at
/// the launch (<see cref="DriveSlip"/>): the pulses count more than the car covered over the first
/// foot, which only the accelerometer can show. The rollout mark's σ must cover that.</summary>
public class DrivenWheelTests
{
    public static TheoryData<int> Seeds => new() { 1, 2, 3, 4, 6, 7, 8 };

    [Theory]
    [MemberData(nameof(Seeds))]
    public void The_rollout_mark_on_a_slipping_driven_wheel_lies_within_three_sigma(int seed)
    {
        PrescribedRecordSpec spec = Records.Standing(seed, launchRiseS: 0.1);
        spec = spec with { Pickup = spec.Pickup with { Slip = new DriveSlip() } };
        (RunAnalysis a, TruthRun t) = Decode(spec);
        FigureSet f = a.Figures;

        // The slip is there to be seen: the pulses alone reach the first foot early.
        Estimate rollout = f.RolloutTimeS!.Value;
        double error = rollout.Value - t.RolloutS!.Value;
        Assert.True(Math.Abs(error) <= 3 * rollout.Sigma, $"{spec}: rollout error {error * 1e3:F2} ms, σ {rollout.Sigma * 1e3:F2} ms");
        FigureChecks.AssertAll(spec.ToString(), FigureChecks.Standing(f, t, slack: 1).Where(c => c.Name != "rollout mark" && c.Name != "first motion").Select(c => c with { Tolerance = double.PositiveInfinity }));
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void The_speed_at_the_rollout_mark_on_a_slipping_driven_wheel_lies_within_three_sigma(int seed)
    {
        // The pulses run ahead of the car at the slip's rate as well as by its distance: a wheel
        // slipping by κ reads κ·v fast. DriveSlip's default, and a launch slip twice its default
        // over a weaker linear part (k 0.001, k_launch 0.03 s²/m: 9 % at 3 m/s² at the start).
        // Before the speed carried the launch slip's rate, the stronger slip read 3.2–5.0σ fast
        // on four of seven seeds (4.6σ at seed 2: +115 mm/s, σ 25 mm/s).
        foreach (DriveSlip slip in new[] { new DriveSlip(), new DriveSlip(PerMps2: 0.001, LaunchPerMps2: 0.03) })
        {
            PrescribedRecordSpec spec = Records.Standing(seed, launchRiseS: 0.1);
            spec = spec with { Pickup = spec.Pickup with { Slip = slip } };
            (RunAnalysis a, TruthRun t) = Decode(spec);
            Estimate speed = a.Figures.RolloutSpeedMps!.Value;
            double error = speed.Value - t.RolloutSpeedMps!.Value;
            Assert.True(Math.Abs(error) <= 3 * speed.Sigma, $"{spec}, {slip}: speed at rollout error {error * 1e3:F1} mm/s, σ {speed.Sigma * 1e3:F1} mm/s ({error / speed.Sigma:F1}σ)");
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void The_rollout_mark_on_a_slipping_driven_wheel_is_covered_when_the_accelerometer_reads_high(int seed)
    {
        // A mild launch slip (a fifth of DriveSlip's default) and an accelerometer that reads
        // high by about as much: the comparison that measures the slip sees little of it, the
        // fused distance and the accelerometer's agree, yet both are long. σ must then carry the
        // accelerometer's own error. 1.5 % is 1.5 of its σ (ReconstructionOptions.AccelScaleSigma,
        // 1 %): the truth must lie within 2σ (before the allowance's Gaussian conditioning on a
        // driven wheel: 2.0–2.2σ on three of seven seeds).
        PrescribedRecordSpec spec = Records.Standing(seed, launchRiseS: 0.1);
        spec = spec with { Pickup = spec.Pickup with { Slip = new DriveSlip(LaunchPerMps2: 0.003) }, Accel = spec.Accel! with { ScaleError = 0.015 } };
        (RunAnalysis a, TruthRun t) = Decode(spec);
        Estimate rollout = a.Figures.RolloutTimeS!.Value;
        double error = rollout.Value - t.RolloutS!.Value;
        Assert.True(Math.Abs(error) <= 2 * rollout.Sigma, $"{spec}: rollout error {error * 1e3:F2} ms, σ {rollout.Sigma * 1e3:F2} ms ({error / rollout.Sigma:F1}σ)");
    }

    public static TheoryData<int> UnkeptSlipSeeds => new() { 1, 3, 5, 7, 9, 11 };

    [Theory]
    [MemberData(nameof(UnkeptSlipSeeds))]
    public void The_rollout_mark_on_a_driven_wheel_whose_slip_is_seen_but_not_kept_lies_within_two_sigma(int seed)
    {
        // A tyre that slips steadily under drive (k 0.0035 s²/m, about 2 % at 6 m/s², a little
        // more at the start), counted by a counter polled every 1.2 ms, the tyre calibrated (told
        // to 0.1 %), the accelerometer 1.5 % high. The brackets are too coarse for the filter to
        // keep the slip (its evidence test), yet the slip coefficient lies many σ from an undriven
        // wheel's: the wheel is driven, and the first foot counts 2 % long. Before the allowance
        // took such a wheel as driven it used the moment estimate, which the high accelerometer
        // all but cancels: seed 1 read −4.0σ (−3.78 ms at σ 0.94 ms), seed 7 −3.4σ, and the speed
        // at the mark +2.7σ and +3.3σ.
        PrescribedRecordSpec spec = Records.Standing(seed, launchRiseS: 0.1) with { Polled = new PolledCounter(1.2e-3, 0.1) };
        spec = spec with
        {
            Pickup = spec.Pickup with { Slip = new DriveSlip(PerMps2: 0.0035, LaunchPerMps2: 0.002) },
            Accel = spec.Accel! with { ScaleError = 0.015 },
        };
        double circumference = spec.Pickup.Tyre.StatedCircumferenceM;
        var told = new AnalysisOptions { Calibration = new CalibrationSettings { CircumferenceM = circumference, CircumferenceSigmaM = 0.001 * circumference } };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r, told).Runs);
        TruthRun t = Assert.Single(r.Truth);

        // The case this is about: a slip the filter saw but did not keep.
        Assert.Equal(new Estimate(0, 0), a.Reconstruction.WheelSlipPerMps2);
        Estimate rollout = a.Figures.RolloutTimeS!.Value;
        double error = rollout.Value - t.RolloutS!.Value;
        Assert.True(Math.Abs(error) <= 2 * rollout.Sigma, $"{spec}: rollout error {error * 1e3:F2} ms, σ {rollout.Sigma * 1e3:F2} ms ({error / rollout.Sigma:F1}σ)");
        Estimate speed = a.Figures.RolloutSpeedMps!.Value;
        double speedError = speed.Value - t.RolloutSpeedMps!.Value;
        Assert.True(Math.Abs(speedError) <= 2 * speed.Sigma, $"{spec}: speed at rollout error {speedError * 1e3:F1} mm/s, σ {speed.Sigma * 1e3:F1} mm/s ({speedError / speed.Sigma:F1}σ)");
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void With_pulses_only_every_figure_on_a_slipping_driven_wheel_lies_within_three_sigma(int seed)
    {
        // Nothing shows the slip without an accelerometer: σ has to allow for it on any wheel.
        PrescribedRecordSpec spec = Records.Standing(seed, launchRiseS: 0.1) with { Accel = null };
        spec = spec with { Pickup = spec.Pickup with { Slip = new DriveSlip() } };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);
        FigureChecks.AssertAll(spec.ToString(), FigureChecks.Standing(a.Figures, t, slack: 1).Select(c => c with { Tolerance = double.PositiveInfinity }));
    }

    /// <summary>The record's CSV files decoded, with its one run's truth.</summary>
    private static (RunAnalysis Analysis, TruthRun Truth) Decode(PrescribedRecordSpec spec)
    {
        PrescribedRecord r = spec.Generate();
        return (Assert.Single(DecoderHarness.AnalyzeText(r).Runs), Assert.Single(r.Truth));
    }
}
