using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The naive first-edge method, the yardstick the reconstruction is measured against.</summary>
public class NaiveReconstructionTests
{
    private const double G0 = 9.80665; // standard gravity, ISO 80000-3
    private const double StartS = 5.0;

    private static SyntheticRun HalfG(int seed, double phase) => new()
    {
        Motion = Motion.FromRestAt(StartS).Accelerate(0.5 * G0, 6).BrakeToStop(6),
        Seed = seed,
        PhaseM = phase,
        ToothErrorFraction = 0,
    };

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.02)]
    [InlineData(0.035)]
    public void StartIsLateByTheTimeToTheFirstEdgeAndDistancesShortByItsDistance(double phase)
    {
        // The first edge is 1.96/48 − φ from standstill; at constant acceleration it comes
        // √(2·d₁/a) after first motion (kinematics, any textbook).
        SyntheticRun synthetic = HalfG(1, phase);
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(synthetic.Build());
        double firstEdge = synthetic.MetresPerPulse - phase;
        double late = Math.Sqrt(2 * firstEdge / (0.5 * G0));

        Assert.Equal(ReconstructionMethod.NaiveFirstEdge, naive.Method);
        Assert.Equal(late, naive.FirstMotionS.Value - StartS, 1e-5);

        // Two seconds in, the naive distance misses the stretch before the first edge.
        double t = StartS + 2;
        double truth = synthetic.Motion.At(t).D;
        Assert.Equal(truth - firstEdge, TrajectoryProbe.DistanceAt(naive.Trajectory, t), 0.01);
    }

    [Fact]
    public void RolloutIsInterpolatedBetweenObservations()
    {
        // Naively the car has rolled out once the first edge plus 1 ft is covered: at half g from
        // rest, when d = 0.3048 + 0.0408333 m, i.e. √(2·0.3456333/4.903325) = 0.37547 s after the
        // true start. Linear interpolation between edges ~0.015 s apart errs by well under 1 ms.
        SyntheticRun synthetic = HalfG(2, 0);
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(synthetic.Build());

        Assert.Equal(0.37547, naive.RolloutTimeS!.Value.Value - StartS, 0.001);
        Assert.Equal(0, naive.RolloutTimeS.Value.Sigma);
    }

    [Fact]
    public void TrajectoryIsValidWithoutUncertainties()
    {
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(HalfG(3, 0.01).Build());

        naive.Trajectory.Validate();
        Assert.Null(naive.Trajectory.DistanceSigmaM);
        Assert.Null(naive.Trajectory.SpeedSigmaMps);
        Assert.Equal(0, TrajectoryProbe.SpeedAt(naive.Trajectory, naive.FirstMotionS.Value - 0.01));

        // Speeds are pulses counted over 0.1 s: at v = a·t ≈ 14.7 m/s about 36 pulses of
        // 0.0408 m, so within one pulse per window (0.41 m/s) of v = a·t at 3 s (kinematics).
        Assert.Equal(0.5 * G0 * 3, TrajectoryProbe.SpeedAt(naive.Trajectory, StartS + 3), 0.45);
    }

    [Fact]
    public void SpeedIsThePulsesCountedOverATenthOfASecond()
    {
        // At constant acceleration the mean speed over a window centred on t is a·t exactly
        // (kinematics); counting whole pulses errs by at most one pulse per window.
        SyntheticRun synthetic = HalfG(4, 0);
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(synthetic.Build());
        double onePulsePerWindow = synthetic.MetresPerPulse / NaiveReconstruction.SpeedWindowS;
        foreach (double t in new[] { 1.0, 2.5, 4.0 })
        {
            Assert.InRange(TrajectoryProbe.SpeedAt(naive.Trajectory, StartS + t) - (0.5 * G0 * t), -onePulsePerWindow - 0.01, onePulsePerWindow + 0.01);
        }
    }

    [Fact]
    public void ReconstructionBeatsTheNaiveStartTenfold()
    {
        for (int seed = 1; seed <= 5; seed++)
        {
            DecodedRun input = new SyntheticRun { Motion = Motion.FromRestAt(StartS).Jerk(35, 5.0 / 35).Accelerate(5, 3), Seed = seed }.Build();
            double ours = Math.Abs(SyntheticRun.Reconstruct(input).FirstMotionS.Value - StartS);
            double naive = Math.Abs(NaiveReconstruction.Reconstruct(input).FirstMotionS.Value - StartS);
            Assert.True(ours * 10 < naive, $"seed {seed}: ours {ours * 1e3:F2} ms, naive {naive * 1e3:F1} ms");
        }
    }

    [Fact]
    public void NoPulsesGivesAWarning()
    {
        var input = new DecodedRun { Source = "none", Configuration = new RunConfiguration { MetresPerPulse = 0.04 }, Pulses = [] };
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(input);

        Assert.Single(naive.Warnings);
        Assert.Null(naive.RolloutTimeS);
    }
}
