using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A standing start whose undriven pickup tyre slips while braked (<see cref="BrakeSlip"/>:
/// the wheel turns slower than the road by a/(g0·C), C 15–30 for car tyres — Pacejka, "Tire and
/// Vehicle Dynamics", ch. 1, linear range, from memory) is a clean run: an undriven wheel cannot
/// run off on its own, and a braked tyre's slip is expected and carried by the accelerometer.
/// The judge once counted the braked wheel's slip as wheelspin (`bench accuracy --runs 400
/// --seed 1`: 63 of 80 generated standing starts doubtful for it, every window after brake onset).</summary>
public class BrakedWheelVerdictTests
{
    [Theory]
    [InlineData(1, 15.0)]
    [InlineData(2, 18.0)]
    [InlineData(3, 22.0)]
    [InlineData(4, 26.0)]
    [InlineData(6, 30.0)]
    public void A_clean_launch_whose_braked_tyre_slips_is_valid(int seed, double stiffness)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        spec = spec with { Pickup = spec.Pickup with { Brake = new BrakeSlip(stiffness) } };
        PrescribedRecord record = spec.Generate();

        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(record).Runs);

        // The truth: a standing start that passes 60 mph, with working sensors.
        TruthRun truth = Assert.Single(record.Truth);
        Assert.True(truth.Standing);
        Assert.NotNull(truth.Interval(TruthSpeedSpan.Mph(0, 60))?.FromStandstillS);
        Verdict verdict = run.Verdict!;
        Assert.True(verdict.Level == VerdictLevel.Valid, $"{spec}: {string.Join("; ", verdict.Reasons.Select(r => $"{r.Code}: {r.Text}"))}");
    }
}
