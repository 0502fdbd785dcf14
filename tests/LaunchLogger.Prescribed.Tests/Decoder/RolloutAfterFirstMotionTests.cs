using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The rollout mark as the report prints it — the time from first motion, with a ± —
/// against the generator's exact first motion and rollout.</summary>
public class RolloutAfterFirstMotionTests
{
    // Seeds 30 and 35 start where first motion is hard to place (−6.9 ms at σ 7.1 ms; −31 ms
    // at σ 54 ms): the rollout mark's σ alone (2.1, 2.6 ms) does not cover the time between.
    public static TheoryData<int, bool> Cases => new() { { 3, false }, { 20, true }, { 30, false }, { 35, false }, { 35, true }, { 40, true } };

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_time_from_first_motion_to_the_rollout_mark_lies_within_three_of_its_printed_sigma(int seed, bool asLog)
    {
        // First motion is the harder instant (the wheel has not turned yet; 100-400 Hz samples
        // and a pickup that lags as it is spun up), the rollout mark the easier one (pulses
        // count the foot): the time between them carries both errors.
        PrescribedRecordSpec spec = Records.Standing(seed, spinUp: true) with
        {
            Polled = seed % 3 == 0 ? new PolledCounter(0.36e-3, 0.1, 1, 5e-3) : null,
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single((asLog ? DecoderHarness.AnalyzeLog(r) : DecoderHarness.AnalyzeText(r)).Runs);
        TruthRun t = Assert.Single(r.Truth);
        RolloutReport rollout = RunReportBuilder.Build(a).Rollout;

        double error = rollout.AfterFirstMotionS!.Value - (t.RolloutS!.Value - t.FirstMotionS!.Value);
        double sigma = rollout.AfterFirstMotionUncertaintyS!.Value;
        Assert.True(Math.Abs(error) <= 3 * sigma, $"seed {seed}: error {error * 1e3:F2} ms, printed σ {sigma * 1e3:F2} ms ({error / sigma:F1}σ); first motion σ {a.Figures.FirstMotionS.Sigma * 1e3:F2} ms");
    }
}
