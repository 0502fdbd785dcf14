using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>An ideal accelerometer: no noise, so its rest reads exactly the same value sample after
/// sample (a test team feeding its instruments' truth) and the rest's noise is read at the variance
/// floor. Such a record must decode like any other, checked against the generator's exact figures
/// (the closed form of its prescribed motion) at the issue's goals, and be called valid. (These
/// take-ups did not make the NaN first motion before the onset fit's mend; the onset fit's own
/// test, NoiselessOnsetTests, holds the take-ups that did.)</summary>
public class NoiselessAccelerometerTests
{
    public static TheoryData<int, LaunchTakeUp> Cases => new()
    {
        { 1, LaunchTakeUp.Ramp }, { 2, LaunchTakeUp.Ramp }, { 3, LaunchTakeUp.RaisedCosine }, { 4, LaunchTakeUp.RaisedCosine }, { 5, LaunchTakeUp.Lagged }, { 7, LaunchTakeUp.Lagged },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void A_noiseless_accelerometer_decodes_to_the_exact_figures(int seed, LaunchTakeUp takeUp)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        PrescribedRecord r = (spec with
        {
            Shape = PrescribedShapes.StandingStart(new Random(seed), takeUp: takeUp),
            Accel = spec.Accel! with { NoiseMicroGPerRootHz = 0 },
        }).Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);

        Assert.True(double.IsFinite(a.Figures.FirstMotionS.Value) && double.IsFinite(a.Figures.FirstMotionS.Sigma), $"{r.Spec}: first motion {a.Figures.FirstMotionS}");
        FigureChecks.AssertAll($"seed {seed}", FigureChecks.Standing(a.Figures, t));
        Assert.True(a.Verdict?.Level == VerdictLevel.Valid, $"{r.Spec}: {a.Verdict?.Level} {string.Join("; ", a.Verdict?.Reasons.Select(x => x.Code) ?? [])}");
    }
}
