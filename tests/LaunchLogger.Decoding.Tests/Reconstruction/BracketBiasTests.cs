using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>A polled counter's bracket width must not bias a figure: the same closed-form launch
/// (constant acceleration, kinematics: v = a·t, d = a·t²/2) written as brackets 0.1, 1 and 10 ms
/// wide gives the same answers, within the goals (5 ms) and within 3 σ, and a wheel that does not slip
/// is not given a slip.</summary>
public class BracketBiasTests
{
    private const double StartS = 5.0;

    private static Motion ConstantLaunch(double accelMps2) =>
        Motion.FromRestAt(StartS).Accelerate(accelMps2, Math.Sqrt(2 * 430 / accelMps2)).BrakeToStop(7);

    [Theory]
    [InlineData(0.1e-3, 5.0, 48)]
    [InlineData(1e-3, 5.0, 48)]
    [InlineData(10e-3, 5.0, 48)]
    [InlineData(1e-3, 3.0, 100)]
    [InlineData(10e-3, 3.0, 100)]
    [InlineData(1e-3, 8.0, 12)]
    public void BracketsOfAnyWidthGiveTheFiguresWithoutBias(double pollS, double accelMps2, int teeth)
    {
        Motion motion = ConstantLaunch(accelMps2);
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 3, Teeth = teeth, PollPeriodS = pollS, PollJitterS = 0.05 * pollS }.Build());

        // Truth in closed form: 60 mph at v/a, the quarter mile at √(2d/a) (exact units: 1 mph =
        // 0.44704 m/s, ¼ mile = 402.336 m).
        double sixtyTruth = 60 * TrajectoryProbe.Mph / accelMps2;
        double quarterTruth = Math.Sqrt(2 * TrajectoryProbe.QuarterMile / accelMps2);
        FigureSet figures = FigureCalculator.Compute(run.Trajectory, run.FirstMotionS, run.RolloutM);
        IntervalFigure sixty = figures.SpeedIntervals.First(i => i.Interval.Label == "0-60 mph");
        MarkFigure quarter = figures.DistanceMarks.First(m => Math.Abs(m.Mark.DistanceM - TrajectoryProbe.QuarterMile) < 1e-6);

        Assert.Equal(0, run.WheelSlipPerMps2!.Value.Value);
        Assert.InRange(sixty.FromStandstillS!.Value - sixtyTruth, -0.005, 0.005);
        Assert.InRange(quarter.FromStandstillS!.Value - quarterTruth, -0.005, 0.005);
        Assert.InRange(Math.Abs(sixty.FromStandstillS!.Value - sixtyTruth), 0, 3 * sixty.UncertaintyS!.Value);
        Assert.InRange(Math.Abs(quarter.FromStandstillS!.Value - quarterTruth), 0, 3 * quarter.UncertaintyS!.Value);
    }

    [Fact]
    public void TheMeanErrorDoesNotGrowWithTheBracketWidth()
    {
        Motion motion = ConstantLaunch(5.0);
        double sixtyTruth = 60 * TrajectoryProbe.Mph / 5.0;
        double MeanError(double pollS)
        {
            double sum = 0;
            for (int seed = 1; seed <= 4; seed++)
            {
                ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = seed, PollPeriodS = pollS, PollJitterS = 0.3 * pollS }.Build());
                sum += TrajectoryProbe.TimeToSpeed(run, 60 * TrajectoryProbe.Mph, run.FirstMotionS.Value) - sixtyTruth;
            }

            return sum / 4;
        }

        double narrow = MeanError(0.1e-3);
        double wide = MeanError(10e-3);
        Assert.InRange(wide - narrow, -0.0015, 0.0015);
    }

    [Fact]
    public void ADrivenWheelThatSlipsKeepsItsSlipAtAOneMillisecondPoll()
    {
        Motion motion = Motion.FromRestAt(StartS).Jerk(40, 0.15).Accelerate(6, 3).Accelerate(0.5, 0.4).Accelerate(4, 3).BrakeToStop(6);
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 18, DriveSlipPerMps2 = 0.005, PollPeriodS = 1e-3, PollJitterS = 0.3e-3 }.Build());

        Assert.InRange(run.WheelSlipPerMps2!.Value.Value, 0.004, 0.006);
    }
}
