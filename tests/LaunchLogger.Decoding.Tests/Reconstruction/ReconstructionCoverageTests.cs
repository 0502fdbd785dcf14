using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>Do the reported σ mean what they say? Over seeded noisy runs (random pickup phase,
/// tooth spread, accelerometer noise, launch shapes from a jump to a 0.25-s torque ramp), the
/// truth must lie within ±2 σ in at least 90 % of the cases — 95 % is the goal; 90 % leaves room
/// for the sampling spread of a few dozen cases (a binomial with p = 0.95 and n = 30 falls below
/// 27 about 6 % of the time).</summary>
public class ReconstructionCoverageTests
{
    private const double StartS = 5.0;
    private const int Cases = 30;

    private static SyntheticRun Case(int seed, bool accelerometer)
    {
        var random = new Random(seed * 101);
        double plateau = 3.5 + (3 * random.NextDouble());
        double jerk = random.NextDouble() < 0.25 ? 0 : 20 + (60 * random.NextDouble());
        Motion motion = Motion.FromRestAt(StartS);
        motion = jerk > 0 ? motion.Jerk(jerk, plateau / jerk).Accelerate(plateau, 1.0) : motion.Accelerate(plateau, 1.2);
        motion = motion.ConstantPower(50 + (40 * random.NextDouble()), 3).BrakeToStop(6);
        return new SyntheticRun
        {
            Motion = motion,
            Seed = seed,
            Teeth = new[] { 12, 24, 48, 60, 100 }[seed % 5],
            PollPeriodS = seed % 2 == 0 ? 250e-6 : null,
            PollJitterS = 40e-6,
            AccelNoiseMps2 = 0.02 + (0.06 * random.NextDouble()),
            WithAccelerometer = accelerometer,
        };
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void TruthLiesWithinTwoSigmaOfFirstMotionAndRollout(bool accelerometer)
    {
        int firstMotionInside = 0;
        int rolloutInside = 0;
        for (int seed = 1; seed <= Cases; seed++)
        {
            SyntheticRun synthetic = Case(seed, accelerometer);
            ReconstructedRun run = SyntheticRun.Reconstruct(synthetic.Build());
            if (Math.Abs(run.FirstMotionS.Value - StartS) <= 2 * run.FirstMotionS.Sigma)
            {
                firstMotionInside++;
            }

            Estimate rollout = run.RolloutTimeS!.Value;
            if (Math.Abs(rollout.Value - synthetic.Motion.TimeAtDistance(TrajectoryProbe.Foot)!.Value) <= 2 * rollout.Sigma)
            {
                rolloutInside++;
            }
        }

        Assert.True(firstMotionInside >= 0.9 * Cases, $"first motion inside 2 σ in {firstMotionInside} of {Cases}");
        Assert.True(rolloutInside >= 0.9 * Cases, $"rollout inside 2 σ in {rolloutInside} of {Cases}");
    }

    [Fact]
    public void FusedErrorsStayWithinTheGoalsAtTheNinetyFifthPercentile()
    {
        var firstMotion = new List<double>();
        var rollout = new List<double>();
        for (int seed = 1; seed <= Cases; seed++)
        {
            SyntheticRun synthetic = Case(seed, accelerometer: true);
            ReconstructedRun run = SyntheticRun.Reconstruct(synthetic.Build());
            firstMotion.Add(Math.Abs(run.FirstMotionS.Value - StartS));
            rollout.Add(Math.Abs(run.RolloutTimeS!.Value.Value - synthetic.Motion.TimeAtDistance(TrajectoryProbe.Foot)!.Value));
        }

        Assert.InRange(Percentile95(firstMotion), 0, 0.005);
        Assert.InRange(Percentile95(rollout), 0, 0.002);
    }

    private static double Percentile95(List<double> values)
    {
        values.Sort();
        return values[(int)Math.Ceiling(0.95 * values.Count) - 1];
    }
}
