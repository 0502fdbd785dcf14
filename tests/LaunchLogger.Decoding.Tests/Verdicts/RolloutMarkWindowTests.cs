using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Tests.Verdicts;

/// <summary>The box's own rollout mark against the window its pulse spacing and wheel slip allow.
/// Times at a distance come from kinematics (t = √(2d/a) from first motion, any textbook).</summary>
public class RolloutMarkWindowTests
{
    private const double Rollout = 0.3048; // 1 ft, exact

    [Fact]
    public void TheWindowRunsFromTwoPulseSpacingsShortOfTheRolloutToTheRollout()
    {
        RunAnalysis run = JudgedRun.Clean();
        TimeWindow window = RolloutMarkWindow.For(run)!.Value;
        Assert.True(run.Figures.RolloutTimeS!.Value.Sigma > 0);
        Assert.Equal(At(Rollout - (2 * JudgedRun.MetresPerPulse)) - Slack(run), window.StartS, 4);
        Assert.Equal(At(Rollout) + Slack(run), window.EndS, 4);
    }

    [Fact]
    public void ACoarsePickupWidensTheWindowToFirstMotion()
    {
        // A 12-tooth pickup on a 1.82 m tyre: 0.152 m a pulse, two spacings more than the rollout.
        // A quick-look mark 97 ms before ours is then explained, not doubtful.
        RunAnalysis coarse = JudgedRun.Clean(run: r => JudgedRun.Copy(r, configuration: r.Configuration with { MetresPerPulse = 0.1518 }));
        TimeWindow window = RolloutMarkWindow.For(coarse)!.Value;
        double ours = coarse.Figures.RolloutTimeS!.Value.Value;
        Assert.Equal(At(Rollout - (2 * 0.1518)) - Slack(coarse), window.StartS, tolerance: 2e-5); // 1-ms samples, linear between
        RunAnalysis early = coarse with { Run = JudgedRun.Copy(coarse.Run, firmwareRolloutS: ours - 0.097) };
        Assert.Empty(RunJudge.Judge(early, null, null).Reasons);
    }

    [Fact]
    public void ABoxWheelThatSpunOrIsNotTheDistanceWheelOpensTheWindowAtFirstMotion()
    {
        RunAnalysis spun = JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [new(1.1, 1.3)]));
        Assert.Equal(JudgedRun.FirstMotionS - Slack(spun), RolloutMarkWindow.For(spun)!.Value.StartS, 9);
        RunAnalysis otherChannel = JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, distanceChannel: 1));
        Assert.Equal(JudgedRun.FirstMotionS - Slack(otherChannel), RolloutMarkWindow.For(otherChannel)!.Value.StartS, 9);

        // Spin that starts only after the rollout does not touch the box's mark.
        RunAnalysis lateSpin = JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [new(3.0, 3.02)]));
        Assert.Equal(RolloutMarkWindow.For(JudgedRun.Clean())!.Value.StartS, RolloutMarkWindow.For(lateSpin)!.Value.StartS, 9);
    }

    [Fact]
    public void AMarkOutsideTheWindowIsDoubtfulOnEitherSideAndInsideIsNot()
    {
        RunAnalysis run = JudgedRun.Clean();
        TimeWindow window = RolloutMarkWindow.For(run)!.Value;
        foreach (double mark in new[] { window.StartS - 0.001, window.EndS + 0.001 })
        {
            Verdict verdict = RunJudge.Judge(run with { Run = JudgedRun.Copy(run.Run, firmwareRolloutS: mark) }, null, null);
            VerdictReason reason = Assert.Single(verdict.Reasons);
            Assert.Equal("rollout_marks_disagree", reason.Code);
            Assert.Equal(VerdictLevel.Doubtful, reason.Level);
            Assert.Contains(mark < window.StartS ? "-1.0 ms" : "+1.0 ms", reason.Text);

            // The window is stated after first motion: from two pulse spacings short of the
            // rollout to the rollout, by kinematics, each widened by the slack.
            string after = string.Create(CultureInfo.InvariantCulture, $"{At(Rollout - (2 * JudgedRun.MetresPerPulse)) - Slack(run) - JudgedRun.FirstMotionS:0.000}–{At(Rollout) + Slack(run) - JudgedRun.FirstMotionS:0.000} s (after first motion)");
            Assert.Contains(after, reason.Text);
        }

        foreach (double mark in new[] { window.StartS + 0.001, window.EndS - 0.001 })
        {
            Assert.Empty(RunJudge.Judge(run with { Run = JudgedRun.Copy(run.Run, firmwareRolloutS: mark) }, null, null).Reasons);
        }
    }

    [Fact]
    public void NoWindowWhenOurTrajectoryNeverReachesTheRollout()
    {
        RunAnalysis run = JudgedRun.Clean(run: r => JudgedRun.Copy(r, configuration: r.Configuration with { RolloutM = 1e6 }));
        Assert.Null(RolloutMarkWindow.For(run));
        Assert.Empty(RunJudge.Judge(run, null, null).Reasons);
    }

    private static double Slack(RunAnalysis run) => VerdictLimits.Default.RolloutDisagreementS + (3 * run.Figures.RolloutTimeS!.Value.Sigma);

    private static double At(double distanceM) => JudgedRun.FirstMotionS + Math.Sqrt(2 * distanceM / JudgedRun.AccelMps2);
}
