using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;
using Xunit.Abstractions;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A launch only just over the box's motion threshold (a constant 42 mg; threshold 40 mg)
/// logged by the firmware core under the longest still block (500 ms) and under the default
/// (50 ms). The box's onset window spans a block, so under the long one its mean passes the
/// threshold only 0.477 s into the launch, after the 48-tooth pickup's first pulse (40.8 mm on,
/// 0.445 s): the pulse opens the run. The box's first-motion mark must still be the launch (the
/// decoder takes its resting level from before that mark), and the decoded run must be the same
/// launch as under the default block, within a small part of its σ and within 3σ of the truth.</summary>
public class SlowLaunchStillBlockTests(ITestOutputHelper output)
{
    private const double LaunchMps2 = 0.042 * TruthUnits.StandardGravity;
    private const double IdleS = 5;

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void A_launch_just_over_the_threshold_decodes_alike_under_the_longest_still_block(int seed)
    {
        PrescribedRecord record = new PrescribedRecordSpec { Shape = PrescribedShapes.ConstantLaunch(LaunchMps2, IdleS), Seed = seed }.Generate();
        TruthRun truth = Assert.Single(record.Truth);
        (DecodedRun shortLog, RunAnalysis shortRun) = Decode(record, LoggerSettings.DefaultStillBlockMs);
        (DecodedRun longLog, RunAnalysis longRun) = Decode(record, LoggerSettings.MaxStillBlockMs);

        // The box's own mark: the onset under the default block; the first pulse opens the run under
        // the long one, its mark taken from the accelerometer's stretch over the threshold.
        Assert.Equal(MotionCause.AccelOnset, (MotionCause)shortLog.Events.Single(e => e.Kind == EventKind.Motion).Values[0]);
        Assert.Equal(MotionCause.PulseCount, (MotionCause)longLog.Events.Single(e => e.Kind == EventKind.Motion).Values[0]);
        Assert.InRange(shortLog.FirmwareMotionS!.Value - truth.FirstMotionS!.Value, -0.01, 0.01);
        Assert.InRange(longLog.FirmwareMotionS!.Value - truth.FirstMotionS!.Value, -0.01, 0.01);

        foreach ((string name, RunAnalysis run) in new[] { ("50 ms", shortRun), ("500 ms", longRun) })
        {
            output.WriteLine($"seed {seed}, block {name}: first motion {run.Figures.FirstMotionS.Value - truth.FirstMotionS.Value:+0.000000;-0.000000} s ± {run.Figures.FirstMotionS.Sigma:0.000000}, rollout {run.Figures.RolloutTimeS!.Value.Value - truth.RolloutS!.Value:+0.000000;-0.000000} s ± {run.Figures.RolloutTimeS.Value.Sigma:0.000000}");
            foreach (FigureCheck check in FigureChecks.Standing(run.Figures, truth).Take(2))
            {
                Assert.True(check.Failure is null, $"seed {seed}, block {name}: {check.Failure}");
            }
        }

        Assert.True(Math.Abs(longRun.Figures.FirstMotionS.Value - shortRun.Figures.FirstMotionS.Value) <= 0.25 * shortRun.Figures.FirstMotionS.Sigma, "first motion");
        Assert.True(Math.Abs(longRun.Figures.RolloutTimeS!.Value.Value - shortRun.Figures.RolloutTimeS!.Value.Value) <= 0.25 * shortRun.Figures.RolloutTimeS.Value.Sigma, "rollout mark");
    }

    private static (DecodedRun Log, RunAnalysis Run) Decode(PrescribedRecord record, int stillBlockMs)
    {
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeLog(record, record.Spec.LogOptions with { StillBlockMicros = stillBlockMs * 1000 }).Runs);
        return (run.Run, run);
    }
}
