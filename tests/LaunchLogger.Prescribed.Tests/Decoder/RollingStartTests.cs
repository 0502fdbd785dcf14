using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Records that open moving: no first motion, the rolling_start reason alone, and a
/// stop measured as well as after a standing start.</summary>
public class RollingStartTests
{
    [Theory]
    [InlineData(5, false)]
    [InlineData(20, false)]
    [InlineData(40, true)]
    [InlineData(60, false)]
    public void A_rolling_start_has_no_first_motion_and_says_rolling_start(double mph, bool asLog)
    {
        PrescribedRecord r = (Records.Standing(3) with { Shape = PrescribedShapes.RollingStart(mph * TruthUnits.MpsPerMph, new Random((int)mph)) }).Generate();
        RunAnalysis a = Assert.Single((asLog ? DecoderHarness.AnalyzeLog(r) : DecoderHarness.AnalyzeText(r)).Runs);

        Assert.False(a.Reconstruction.Staged);
        Assert.Equal(["rolling_start"], a.Verdict!.Reasons.Select(x => x.Code));
        RunReport report = RunReportBuilder.Build(a);
        Assert.Null(report.FirstMotionS);
        Assert.Null(report.FirstMotionUncertaintyS);
    }

    [Theory]
    [InlineData(5)]
    [InlineData(20)]
    [InlineData(40)]
    public void The_stop_after_a_rolling_start_from_text_files_with_an_accelerometer(double mph)
    {
        // Measured before the fix: onset 57–65 ms late and the stopping distance 1.7–2.0 m short,
        // the accelerometer's level having been taken from its first sample. Now within 1 ms / 0.01 m.
        PrescribedRecord r = (Records.Standing(3) with { Shape = PrescribedShapes.RollingStart(mph * TruthUnits.MpsPerMph, new Random((int)mph)) }).Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        FigureChecks.AssertAll(r.Spec.ToString(), FigureChecks.Stop(a, Assert.Single(r.Truth)));
    }
}
