using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The pulses' scale measured from a standing start against a calibrated accelerometer,
/// checked against the generator's tyre: it rolls on a circumference 0–2 % below the one the box
/// is told and grows with speed, the accelerometer reads up to a few per cent off and is told its
/// scale to 0.2 %, as a calibration against gravity gives it. The truth is the generator's.</summary>
public class RollingScaleTests
{
    private const int Records = 16;

    [Fact]
    public void The_measured_rolling_scale_lies_within_its_sigma_of_the_generators_tyre()
    {
        var random = new Random(20261204);
        int within2 = 0;
        var lines = new List<string>();
        for (int i = 0; i < Records; i++)
        {
            (PrescribedRecordSpec spec, AnalysisOptions options, double truth) = Draw(i, random);
            PrescribedRecord record = spec.Generate();
            SessionAnalysis session = i % 2 == 0 ? DecoderHarness.AnalyzeLog(record, options) : DecoderHarness.AnalyzeText(record, options);
            RunAnalysis run = Assert.Single(session.Runs);
            Estimate? scale = run.Reconstruction.RollingScale;
            Assert.True(scale.HasValue, $"{spec}: no rolling scale measured");
            double z = (scale!.Value.Value - truth) / scale.Value.Sigma;
            string what = FormattableString.Invariant($"{spec}: rolling/told {scale.Value.Value:0.00000} ± {scale.Value.Sigma:0.00000} against {truth:0.00000} ({z:+0.0;-0.0}σ)");
            lines.Add(what);

            // Every record within ±3σ; the σ is the posterior, narrower than the 1 % prior.
            Assert.True(Math.Abs(z) <= 3, what);
            Assert.True(scale.Value.Sigma < 0.01, what);
            within2 += Math.Abs(z) <= 2 ? 1 : 0;
        }

        // ±2σ holds 95 % of a normal error: at most one of 16 outside (binomial, 81 % likely).
        Assert.True(within2 >= Records - 1, string.Join("\n", lines));
    }

    [Fact]
    public void Without_an_accelerometer_calibration_nothing_is_measured_and_nothing_moves()
    {
        (PrescribedRecordSpec spec, _, _) = Draw(3, new Random(7));
        PrescribedRecord record = spec.Generate();
        RunAnalysis plain = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs);
        RunAnalysis empty = Assert.Single(DecoderHarness.AnalyzeLog(record, new AnalysisOptions { Calibration = new CalibrationSettings() }).Runs);

        Assert.Null(plain.Reconstruction.RollingScale);
        Assert.Equal(plain.Reconstruction.Trajectory.DistanceM, empty.Reconstruction.Trajectory.DistanceM);
        Assert.Equal(plain.Reconstruction.Trajectory.DistanceSigmaM, empty.Reconstruction.Trajectory.DistanceSigmaM);
    }

    [Fact]
    public void The_measured_scale_brings_distance_and_its_sigma_to_the_truth()
    {
        (PrescribedRecordSpec spec, AnalysisOptions options, _) = Draw(5, new Random(11));
        PrescribedRecord record = spec.Generate();
        TruthRun truth = Assert.Single(record.Truth);
        RunAnalysis told = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs);
        RunAnalysis measured = Assert.Single(DecoderHarness.AnalyzeLog(record, options).Runs);
        double truthRollout = truth.RolloutS!.Value;

        // The static circumference puts the rollout mark early by about ½·ε·t; measured, the mark
        // moves toward the truth and its σ narrows.
        Estimate before = told.Reconstruction.RolloutTimeS!.Value;
        Estimate after = measured.Reconstruction.RolloutTimeS!.Value;
        Assert.True(Math.Abs(after.Value - truthRollout) <= 3 * after.Sigma, $"{after} against {truthRollout}");
        Assert.True(after.Sigma < before.Sigma, $"σ {after.Sigma} against {before.Sigma} before");
    }

    /// <summary>A standing start with an uncalibrated tyre (rolling 0–2 % below the told
    /// circumference, growth 0.1–0.6 % at 30 m/s) and an accelerometer 1 % σ off in scale, told to
    /// 0.2 %: the spec, the options that tell the calibration, and the true rolling/told ratio.</summary>
    private static (PrescribedRecordSpec Spec, AnalysisOptions Options, double Truth) Draw(int i, Random random) =>
        Decoder.Records.OffScaleTyre(Decoder.Records.Standing(i + 1), random);
}
