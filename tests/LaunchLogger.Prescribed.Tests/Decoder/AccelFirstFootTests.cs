using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The accelerometer's own distance at the first foot (what the launch-slip allowance
/// weighs the pulses against) and the σ the decoder states for it, against the independent
/// generator's trajectory.</summary>
public class AccelFirstFootTests
{
    public static TheoryData<int> Seeds => new() { 1, 2, 3, 4, 6, 7, 8 };

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_true_scale_puts_the_accelerometers_first_foot_within_two_sigma(int seed)
    {
        (double error, double sigma, double distance) = FirstFoot(Records.Standing(seed, launchRiseS: 0.1));

        Assert.InRange(distance, 0.3048, 0.36);
        Assert.True(Math.Abs(error) <= 2 * sigma, $"seed {seed}: error {error * 1e3:F2} mm, σ {sigma * 1e3:F2} mm");
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_scale_two_percent_high_reads_the_first_foot_two_percent_long_and_within_three_sigma(int seed)
    {
        // A sensor that reads (1 + s) times the force integrates, from rest, to (1 + s) times the
        // distance (closed form): the check must show that error, and 2 % is 2 of the scale's σ
        // (ReconstructionOptions.AccelScaleSigma, 1 %; "about 1 % for consumer MEMS parts",
        // common practice), so the truth lies within 3σ.
        const double Scale = 0.02;
        PrescribedRecordSpec spec = Records.Standing(seed, launchRiseS: 0.1);
        (double error, double sigma, double distance) = FirstFoot(spec with { Accel = spec.Accel! with { ScaleError = Scale } });
        double expected = Scale / (1 + Scale) * distance;

        Assert.True(Math.Abs(error - expected) <= 1.5e-3, $"seed {seed}: error {error * 1e3:F2} mm, closed form {expected * 1e3:F2} mm");
        Assert.True(Math.Abs(error) <= 3 * sigma, $"seed {seed}: error {error * 1e3:F2} mm, σ {sigma * 1e3:F2} mm ({error / sigma:F1}σ)");
    }

    /// <summary>The check's distance less the generator's at the same moment, its σ, and the
    /// distance itself, m.</summary>
    private static (double Error, double Sigma, double Distance) FirstFoot(PrescribedRecordSpec spec)
    {
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);
        AccelDistanceCheck check = Assert.IsType<AccelDistanceCheck>(a.Reconstruction.AccelOnlyFirstFoot);
        double truth = spec.Shape.Profile.StateAt(check.TimeS).DistanceM - t.OriginM;
        return (check.DistanceM - truth, check.SigmaM, check.DistanceM);
    }
}
