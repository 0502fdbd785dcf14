using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Launches that take up smoothly: the generator's standing start with its rise drawn as
/// a raised cosine (<see cref="PrescribedShapes.SmoothRise"/>; the jerk starts from zero, so the
/// acceleration rises like τ², not τ), decoded whole from files, its first motion against the
/// generator's own truth. Before the onset fit had a smooth shape, such rises were read late by
/// 3–13 ms at 2–5σ (issue 9, ACCURACY-NOTES.md). Every one here must lie within ±3σ and within
/// 8 ms: over seeds 1–30 (a scratch run, not kept) the errors were −2.3 to +5.8 ms, none beyond
/// 1.4σ; the goal of 5 ms is a 95th percentile (bench group GeneratedStandingSmooth), so a
/// single slow rise may pass it.</summary>
public class SmoothLaunchOnsetTests
{
    /// <summary>Rises of 0.06–0.31 s and 0.44–1.1 g, 100–1600 Hz, 8–100 teeth, with and without
    /// the wheel's spin-up lag.</summary>
    public static TheoryData<int> Seeds => new() { 6, 12, 22, 27, 28 };

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_smooth_take_up_has_its_first_motion_within_its_sigma(int seed)
    {
        PrescribedRecordSpec spec = Records.Standing(seed, spinUp: seed % 2 == 0);
        PrescribedRecord r = (spec with { Shape = PrescribedShapes.StandingStart(new Random(seed), takeUp: LaunchTakeUp.RaisedCosine) }).Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);
        FigureCheck check = new("first motion", a.Figures.FirstMotionS.Value, a.Figures.FirstMotionS.Sigma, t.FirstMotionS!.Value, 8e-3, 2e-4);
        Assert.True(check.Failure is null, $"{r.Spec}: {check.Failure}");
    }
}
