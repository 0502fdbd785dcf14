using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A stop at the end of a launch, with a tyre the box was told the static circumference
/// of: the stopping distance is a difference of two positions, so an error of scale along the
/// path counts on the stop's own length, not on the whole run's twice over.</summary>
public class StoppingDistanceSigmaTests
{
    [Theory]
    [InlineData(1, 0.985, 0.004)]
    [InlineData(2, 0.999, 0.001)]
    [InlineData(4, 0.980, 0.006)]
    public void The_stopping_distance_sigma_carries_the_circumference_on_the_stop_only(int seed, double rollingOverStatic, double growthAt30Mps)
    {
        PrescribedRecordSpec spec = Records.Standing(seed) with
        {
            Pickup = new WheelPickup(48, new TyreModel(1.95, 1.95 * rollingOverStatic, growthAt30Mps), 0.3),
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        double error = a.Braking!.StoppingDistanceM.Value - truth.StoppingDistanceM;
        double sigma = a.Braking.StoppingDistanceM.Sigma;
        string what = $"{spec}: stopping distance {truth.StoppingDistanceM:F2} m, error {error:F3} m, σ {sigma:F3} m";

        // The truth within 3 σ (the tyre rolls 0–2 % small and grows up to 0.6 % at 30 m/s).
        Assert.True(Math.Abs(error) <= 3 * sigma, what);

        // No wider than the stop's own length allows: past the onset's σ (this wheel does not
        // slip under braking, and the decoder is told so), the path's σ is the circumference's (1 %) and the growth's
        // (0.3 % at 30 m/s) on the stop's length, with a few centimetres for the ends — where two
        // independent 1 % errors on the positions of onset and standstill, hundreds of metres down
        // the road, gave several metres.
        var options = new ReconstructionOptions();
        double onsetPart = a.Braking.FromMps * a.Braking.OnsetS.Sigma;
        Assert.Equal(0, a.Braking.BrakeSlipCorrectionM);
        double path = Math.Sqrt(Math.Max((sigma * sigma) - (onsetPart * onsetPart), 0));
        double allowed = ((options.CircumferenceSigmaFraction + options.TyreGrowthSigmaAt30Mps) * truth.StoppingDistanceM) + 0.1;
        Assert.True(path <= allowed, what + $", path σ {path:F3} m, allowed {allowed:F3} m");
    }
}
