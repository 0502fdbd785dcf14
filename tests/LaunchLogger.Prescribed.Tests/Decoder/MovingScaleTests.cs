using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The pulses' scale measured on records that open moving — rolling starts (their
/// changes of speed, and the stop they end in) and stops from cruise (the acceleration
/// integrated from the brakes down to the rest, against the pulses before the brakes) — against
/// an accelerometer whose scale is calibrated to 0.2 %, with a tyre rolling 1–2 % below the
/// circumference told and growing by 0.1–0.6 % at 30 m/s. The truth is the generator's.</summary>
public class MovingScaleTests
{
    public static TheoryData<int, bool> Seeds => new() { { 1, false }, { 2, true }, { 3, false }, { 4, true } };

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_rolling_start_measures_the_scale_and_its_figures_come_closer_to_the_truth(int seed, bool asLog)
    {
        var random = new Random(seed * 17);
        Shape shape = PrescribedShapes.RollingStart((10 + (40 * random.NextDouble())) * TruthUnits.MpsPerMph, random);
        Check(seed, asLog, shape, random, passing: true);
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_stop_from_cruise_measures_the_scale_and_its_distance_comes_closer_to_the_truth(int seed, bool asLog)
    {
        var random = new Random(seed * 31);
        Shape shape = PrescribedShapes.CruiseThenStop((30 + (50 * random.NextDouble())) * TruthUnits.MpsPerMph, 0.05 + (1.95 * random.NextDouble()), 9.80665 * (0.5 + (0.5 * random.NextDouble())));
        Check(seed, asLog, shape, random, passing: false);
    }

    /// <summary>A stop from cruise logged by a loop polled every 0.3 ms that stalls 20 ms once a
    /// second: a 1600-Hz accelerometer's buffer overflows in each stall and its samples have gaps.
    /// The scale is still measured across them (before, the fit's integral stopped at the first
    /// gap, nothing was measured, and the told circumference's 1–2 % stayed in the distance).</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void A_stop_logged_through_a_stalling_loop_measures_the_scale_across_the_accelerometers_gaps(int seed)
    {
        var random = new Random(seed * 43);
        Shape shape = PrescribedShapes.CruiseThenStop((30 + (50 * random.NextDouble())) * TruthUnits.MpsPerMph, 0.05 + (1.95 * random.NextDouble()), 9.80665 * (0.5 + (0.5 * random.NextDouble())));
        Check(seed, true, shape, random, passing: false, stalled: spec => spec with
        {
            Accel = spec.Accel! with { RateHz = 1600 },
            Polled = new PolledCounter(3e-4, 0.1, 1, 0.02),
        });
    }

    /// <summary>Without a calibration the accelerometer's scale (drawn with σ 1 %) is no better
    /// than the tyre's prior (a static circumference told): the scale is neither measured nor reported,
    /// but the tyre's growth with speed, a change of scale over the record's speeds that a
    /// constant accelerometer scale leaves as it is, is measured within 3σ of the generator's.</summary>
    [Theory]
    [InlineData(5)]
    [InlineData(6)]
    [InlineData(7)]
    public void Without_an_accelerometer_calibration_a_rolling_start_measures_the_growth_but_not_the_scale(int seed)
    {
        var random = new Random(seed);
        Shape shape = PrescribedShapes.RollingStart(30 * TruthUnits.MpsPerMph, random);
        (PrescribedRecordSpec spec, _, _) = Draw(seed, shape, random);
        var staticTold = new AnalysisOptions { Calibration = new LaunchLogger.Decoding.Calibration.CalibrationSettings { StaticCircumferenceM = spec.Pickup.Tyre.StatedCircumferenceM } };
        RunAnalysis plain = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate(), staticTold).Runs);
        Assert.Null(plain.Reconstruction.RollingScale);
        Assert.DoesNotContain(plain.Reconstruction.Warnings, w => w.Contains("scale was measured", StringComparison.Ordinal));
        string note = Assert.Single(plain.Reconstruction.Warnings, w => w.StartsWith("the tyre's growth with speed was measured", StringComparison.Ordinal));
        System.Text.RegularExpressions.Match m = System.Text.RegularExpressions.Regex.Match(note, @"(-?[0-9.]+) % ± ([0-9.]+) % at 30 m/s");
        Assert.True(m.Success, note);
        double growth = double.Parse(m.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture) / 100;
        double sigma = double.Parse(m.Groups[2].Value, System.Globalization.CultureInfo.InvariantCulture) / 100;
        double truth = spec.Pickup.Tyre.GrowthAt30Mps;
        Assert.True(Math.Abs(growth - truth) <= (3 * sigma) + 5e-5, FormattableString.Invariant($"{spec}: growth {growth:0.0000} ± {sigma:0.0000} against {truth:0.0000}"));
        Assert.True(sigma < new LaunchLogger.Decoding.Reconstruction.ReconstructionOptions().TyreGrowthSigmaAt30Mps, note);
    }

    /// <summary>The measured scale within 3σ of the tyre's (σ under the 1 % prior); the stopping
    /// distance and, for a rolling start, the passing times within 3σ of the truth and at most
    /// half as far from it as with the circumference told (a static circumference 1–2 % off:
    /// the error the calibration is there to remove; the bench carries the spread).</summary>
    private static void Check(int seed, bool asLog, Shape shape, Random random, bool passing, Func<PrescribedRecordSpec, PrescribedRecordSpec>? stalled = null)
    {
        (PrescribedRecordSpec spec, AnalysisOptions options, double truth) = Draw(seed, shape, random);
        spec = stalled?.Invoke(spec) ?? spec;
        PrescribedRecord record = spec.Generate();
        TruthRun t = Assert.Single(record.Truth);
        RunAnalysis told = Assert.Single((asLog ? DecoderHarness.AnalyzeLog(record) : DecoderHarness.AnalyzeText(record)).Runs);
        RunAnalysis measured = Assert.Single((asLog ? DecoderHarness.AnalyzeLog(record, options) : DecoderHarness.AnalyzeText(record, options)).Runs);
        if (stalled is not null)
        {
            // The record has the gaps it is meant to have.
            Assert.Contains(measured.Verdict!.Reasons, r => r.Code == "accel_overflow");
        }

        Estimate scale = measured.Reconstruction.RollingScale ?? throw new Xunit.Sdk.XunitException($"{spec}: no rolling scale measured");
        string what = FormattableString.Invariant($"{spec}: rolling/told {scale.Value:0.00000} ± {scale.Sigma:0.00000} against {truth:0.00000}");
        Assert.True(Math.Abs(scale.Value - truth) <= 3 * scale.Sigma, what);
        Assert.True(scale.Sigma < 0.01, what);

        var errors = new List<(string Name, double Told, double Measured, double Sigma)>();
        TruthStop stop = t.Stop!;
        errors.Add(("stopping distance", told.Braking!.StoppingDistanceM.Value - stop.StoppingDistanceM, measured.Braking!.StoppingDistanceM.Value - stop.StoppingDistanceM, measured.Braking.StoppingDistanceM.Sigma));
        if (passing)
        {
            foreach (FigureCheck check in FigureChecks.Passing(measured.Figures, t))
            {
                FigureCheck before = FigureChecks.Passing(told.Figures, t).Single(c => c.Name == check.Name);
                errors.Add((check.Name, before.Error!.Value, check.Error!.Value, check.Sigma!.Value));
            }
        }

        string table = what + "\n  " + string.Join("\n  ", errors.Select(e => FormattableString.Invariant($"{e.Name}: told {e.Told:+0.0000;-0.0000}, measured {e.Measured:+0.0000;-0.0000} ± {e.Sigma:0.0000}")));
        Assert.All(errors, e => Assert.True(Math.Abs(e.Measured) <= 3 * e.Sigma, table));
        Assert.True(Math.Abs(errors[0].Measured) <= 0.5 * Math.Abs(errors[0].Told), table);
        Assert.True(errors.Skip(1).Sum(e => Math.Abs(e.Measured)) <= 0.5 * errors.Skip(1).Sum(e => Math.Abs(e.Told)), table);
    }

    /// <summary>The record with a tyre rolling 1–2 % below the circumference told (the error the
    /// calibration is there to remove) and a calibrated accelerometer (<see cref="Records.OffScaleTyre"/>).</summary>
    private static (PrescribedRecordSpec Spec, AnalysisOptions Options, double Truth) Draw(int seed, Shape shape, Random random) =>
        Records.OffScaleTyre(Records.Standing(seed) with { Shape = shape }, random, ratioSpan: 0.01);
}
