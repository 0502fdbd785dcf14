using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A stop from cruise seen by pulses alone: the onset is read off a trajectory the
/// pulses resolve only as finely as their positions are known, and its σ must say so.</summary>
public class PulsesOnlyStopTests
{
    [Theory]
    [InlineData(48, null)]
    [InlineData(16, 2e-3)]
    [InlineData(16, 7.5e-3)]
    public void The_onset_from_pulses_alone_lies_within_its_stated_three_sigma(int teeth, double? pollS)
    {
        PrescribedRecordSpec spec = Records.Standing(5) with
        {
            Shape = PrescribedShapes.CruiseThenStop(60 * TruthUnits.MpsPerMph, 0.2, 0.8 * TruthUnits.StandardGravity),
            Pickup = new WheelPickup(teeth, TyreModel.Calibrated(1.9)),
            Polled = pollS is { } p ? new PolledCounter(p, 0.1) : null,
            Accel = null,
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;

        // Before the smoothing term the polled 16-tooth case's σ was a tenth of its error (the
        // simulator's pulses-only stops: 106 ms early at σ 11 ms).
        double error = a.Braking!.OnsetS.Value - truth.OnsetS;
        Assert.True(Math.Abs(error) <= 3 * a.Braking.OnsetS.Sigma, $"{spec}: onset error {error * 1e3:F1} ms, σ {a.Braking.OnsetS.Sigma * 1e3:F1} ms");
    }
}
