using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>Reconstruction of runs built from closed-form motions (kinematics, any textbook; see
/// <see cref="Motion"/>): the answers are compared with the motion that made the data.</summary>
/// <remarks>Unless a test says otherwise the data have 48 pulses per 1.96 m, exact edges with
/// 0.5 % tooth spread, and a 1 kHz accelerometer with 0.04 m/s² noise, 1-mg steps, a 0.1 m/s²
/// offset, 0.02 rad resting pitch and 1 mrad of squat per m/s² (<see cref="SyntheticRun"/>).
/// Tolerances are about three times the error measured on each case (the figure stands beside
/// it), so a change of a millisecond to a timed figure fails; never wider than the product's
/// accuracy goals (first motion and 0–60 mph within 5 ms, rollout within 2 ms).</remarks>
public class ReconstructorTests
{
    private const double G0 = 9.80665; // standard gravity, ISO 80000-3
    private const double StartS = 5.0;

    private static Motion HalfGToSixtyAndStop() => Motion.FromRestAt(StartS).Accelerate(0.5 * G0, 6).BrakeToStop(6);

    /// <summary>A drag-strip style launch: drive torque building up at a constant jerk to the
    /// traction limit, held there, then power-limited (F = P/v), then braking to rest.</summary>
    private static Motion QuarterMileLaunch() =>
        Motion.FromRestAt(StartS).Jerk(35, 5.0 / 35).Accelerate(5.0, 1.5).ConstantPower(85, 14).BrakeToStop(6);

    [Fact]
    public void FusedRunReportsItsMethodAndAValidTrajectory()
    {
        DecodedRun input = new SyntheticRun { Motion = HalfGToSixtyAndStop() }.Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input);

        Assert.Same(input, run.Source);
        Assert.Equal(ReconstructionMethod.PulsesAndAccelerometer, run.Method);
        run.Trajectory.Validate();
        Assert.NotNull(run.Trajectory.DistanceSigmaM);
        Assert.NotNull(run.Trajectory.SpeedSigmaMps);
        Assert.True(run.Trajectory.TimeS[0] < run.FirstMotionS.Value, "the grid starts before first motion");
        Assert.Equal(0, TrajectoryProbe.DistanceAt(run.Trajectory, run.FirstMotionS.Value - 0.05));
        Assert.Equal(0.3048, run.RolloutM);
        Assert.Empty(run.WheelspinWindows);
    }

    // Tolerances: about three times the error measured on each case (figures beside them, ms),
    // never wider than the product's goals.
    [Theory]
    [InlineData("exact edges", null, 0.17, 0.04, 0.20)]
    [InlineData("polled 250 µs", 250e-6, 0.09, 0.26, 0.08)]
    [InlineData("polled 1 ms", 1e-3, 0.46, 0.03, 2.63)] // 0-60: the known bias of 1-ms brackets (a 5 ms goal holds it until the bracket model is fixed)
    public void FirstMotionRolloutAndSixtyAreWithinThreeTimesTheirMeasuredError(string capture, double? pollS, double firstMotionMs, double rolloutMs, double sixtyMs)
    {
        _ = capture;
        Motion motion = QuarterMileLaunch();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 5, PollPeriodS = pollS, PollJitterS = 40e-6 }.Build());

        double rolloutTruth = motion.TimeAtDistance(TrajectoryProbe.Foot)!.Value;
        double sixtyTruth = motion.TimeAtSpeed(60 * TrajectoryProbe.Mph)!.Value;
        AssertWithin(run.FirstMotionS.Value - StartS, Tolerance(firstMotionMs));
        AssertWithin(run.RolloutTimeS!.Value.Value - rolloutTruth, Tolerance(rolloutMs));
        AssertWithin(TrajectoryProbe.TimeToSpeed(run, 60 * TrajectoryProbe.Mph, run.FirstMotionS.Value) - (sixtyTruth - StartS), Math.Min(0.005, Tolerance(sixtyMs)));

        // And each within 3 of its own stated σ.
        AssertWithin(run.FirstMotionS.Value - StartS, 3 * run.FirstMotionS.Sigma);
        AssertWithin(run.RolloutTimeS!.Value.Value - rolloutTruth, 3 * run.RolloutTimeS!.Value.Sigma);
    }

    [Fact]
    public void FirstMotionIsUnbiasedOverManySeeds()
    {
        // Over seeds 1-12 the mean first-motion error measured -0.13 ms with a spread of 0.54 ms
        // (0.16 ms on the mean): held within ±0.5 ms, so a shift of 1 ms anywhere fails.
        Motion motion = HalfGToSixtyAndStop();
        double mean = Enumerable.Range(1, 12).Average(seed => SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = seed }.Build()).FirstMotionS.Value - StartS);
        AssertWithin(mean, 0.0005);
    }

    [Fact]
    public void QuarterMileTimeAndTrapSpeedAreWithinThreeTimesTheirMeasuredError()
    {
        Motion motion = QuarterMileLaunch();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 8, PollPeriodS = 250e-6, PollJitterS = 40e-6 }.Build());

        // Trap: mean speed over the 66 ft ending at the quarter-mile line (common practice).
        double trapStart = TrajectoryProbe.QuarterMile - (66 * TrajectoryProbe.Foot);
        double end = motion.TimeAtDistance(TrajectoryProbe.QuarterMile)!.Value;
        double trapTruth = 66 * TrajectoryProbe.Foot / (end - motion.TimeAtDistance(trapStart)!.Value);
        double ours = TrajectoryProbe.TimeToDistance(run, TrajectoryProbe.QuarterMile, 0);
        double oursTrap = 66 * TrajectoryProbe.Foot / (ours - TrajectoryProbe.TimeToDistance(run, trapStart, 0));

        AssertWithin((ours - run.FirstMotionS.Value) - (end - StartS), Tolerance(0.80)); // measured -0.80 ms
        AssertWithin(oursTrap - trapTruth, 0.002); // measured 0.0006 m/s
    }

    [Theory]
    [InlineData(12, 0.16, 0.98)]
    [InlineData(48, 0.21, 0.34)]
    [InlineData(100, 0.19, 0.20)]
    public void AnyPickupFrom12To100PulsesWorks(int teeth, double firstMotionMs, double rolloutMs)
    {
        Motion motion = QuarterMileLaunch();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 2, Teeth = teeth }.Build());

        AssertWithin(run.FirstMotionS.Value - StartS, Tolerance(firstMotionMs));
        AssertWithin(run.RolloutTimeS!.Value.Value - motion.TimeAtDistance(TrajectoryProbe.Foot)!.Value, Math.Min(0.002, Tolerance(rolloutMs)));
        Assert.NotNull(run.FirstPulseDistanceM);
    }

    /// <summary>Three times a measured error given in ms, at least 0.3 ms (the figures differ by
    /// seed and by other changes to the estimator at that level), in s.</summary>
    private static double Tolerance(double measuredMs) => Math.Max(3 * measuredMs, 0.3) * 1e-3;

    private static void AssertWithin(double error, double tolerance) => Assert.InRange(error, -tolerance, tolerance);

    [Fact]
    public void SpeedBetweenPulsesFollowsTheMotion()
    {
        // Constant acceleration then constant speed (kinematics, any textbook).
        Motion motion = Motion.FromRestAt(StartS).Accelerate(3.0, 4).Cruise(3).BrakeToStop(5);
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 4, Teeth = 12 }.Build());

        // Measured at most 0.0038 m/s over these times: held to 0.012 m/s.
        foreach (double t in new[] { 0.3, 1.0, 2.5, 4.0, 5.0, 6.5 })
        {
            AssertWithin(TrajectoryProbe.SpeedAt(run.Trajectory, StartS + t) - motion.At(StartS + t).V, 0.012);
        }
    }

    [Fact]
    public void PowerLimitedSpeedFollowsTheClosedForm()
    {
        // Under constant power per mass p the kinetic energy rises linearly: v = √(v₀² + 2·p·τ).
        Motion motion = Motion.FromRestAt(StartS).Accelerate(4.0, 2.0).ConstantPower(60, 8).BrakeToStop(6);
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 6 }.Build());

        foreach (double tau in new[] { 0.5, 2.0, 4.0, 7.9 })
        {
            double expected = Math.Sqrt((8.0 * 8.0) + (2 * 60 * tau));
            Assert.Equal(expected, motion.At(StartS + 2.0 + tau).V, 9);
            AssertWithin(TrajectoryProbe.SpeedAt(run.Trajectory, StartS + 2.0 + tau) - expected, 0.0005); // measured at most 0.00014 m/s
        }
    }

    [Fact]
    public void SpeedIsZeroFromTheStopOn()
    {
        // Braking at a constant 6 m/s² from 29.4 m/s stops the car 4.9 s later, d = v²/(2a) further on.
        Motion motion = HalfGToSixtyAndStop();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 9 }.Build());

        Assert.NotNull(run.StopS);
        Assert.InRange(run.StopS!.Value - motion.EndS, -0.05, 0.05);
        Trajectory trajectory = run.Trajectory;
        Assert.True(trajectory.TimeS[^1] > motion.EndS + 1, "the trajectory runs on past the stop");
        for (int k = 0; k < trajectory.Count; k++)
        {
            if (trajectory.TimeS[k] >= run.StopS.Value)
            {
                Assert.Equal(0, trajectory.SpeedMps[k]);
                Assert.Equal(trajectory.DistanceM[^1], trajectory.DistanceM[k], 9);
            }
        }

        // Half a second before the stop: v = 6 × 0.5 = 3 m/s. The whole distance within 5 cm.
        Assert.InRange(TrajectoryProbe.SpeedAt(trajectory, motion.EndS - 0.5) - 3.0, -0.03, 0.03);
        Assert.InRange(trajectory.DistanceM[^1] - motion.At(motion.EndS).D, -0.05, 0.05);
    }

    [Fact]
    public void PulsesOnlyBackExtrapolatesWithAnHonestUncertainty()
    {
        Motion motion = QuarterMileLaunch();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 3, WithAccelerometer = false }.Build());
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(new SyntheticRun { Motion = motion, Seed = 3, WithAccelerometer = false }.Build());

        Assert.Equal(ReconstructionMethod.PulsesOnly, run.Method);
        Assert.Contains(run.Warnings, w => w.Contains("no accelerometer"));
        Assert.Null(run.AccelBiasMps2);

        // Nothing is seen before the first pulse, so the σ is tens of milliseconds; the truth
        // lies within 2 σ, and the answer still beats the first-edge start.
        double error = run.FirstMotionS.Value - StartS;
        Assert.InRange(run.FirstMotionS.Sigma, 0.005, 0.1);
        Assert.InRange(Math.Abs(error), 0, 2 * run.FirstMotionS.Sigma);
        Assert.True(Math.Abs(error) < Math.Abs(naive.FirstMotionS.Value - StartS));
        double rolloutError = run.RolloutTimeS!.Value.Value - motion.TimeAtDistance(TrajectoryProbe.Foot)!.Value;
        Assert.InRange(Math.Abs(rolloutError), 0, 2 * run.RolloutTimeS!.Value.Sigma);

        // Once the pulses come thick and fast the speed is as good as with an accelerometer.
        Assert.InRange(TrajectoryProbe.SpeedAt(run.Trajectory, StartS + 5) - motion.At(StartS + 5).V, -0.03, 0.03);
    }

    [Fact]
    public void AccelerometerOnlyIntegratesAndWarnsOfDrift()
    {
        Motion motion = Motion.FromRestAt(StartS).Jerk(35, 5.0 / 35).Accelerate(5.0, 2.0).BrakeToStop(5);
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 10, WithPulses = false }.Build());

        Assert.Equal(ReconstructionMethod.AccelerometerOnly, run.Method);
        Assert.Contains(run.Warnings, w => w.Contains("drift"));
        Assert.Null(run.FirstPulseDistanceM);
        Assert.InRange(run.FirstMotionS.Value - StartS, -0.005, 0.005);

        // The car stands still after the stop, which pins the drift down: zero speed there, and
        // in between the error stays within its own 3 σ.
        Assert.NotNull(run.StopS);
        Assert.Equal(0, run.Trajectory.SpeedMps[^1]);
        foreach (double t in new[] { 0.5, 1.5, 3.0 })
        {
            double sigma = TrajectoryProbe.At(run.Trajectory, run.Trajectory.SpeedSigmaMps!, StartS + t);
            Assert.InRange(TrajectoryProbe.SpeedAt(run.Trajectory, StartS + t) - motion.At(StartS + t).V, -3 * sigma - 0.01, 3 * sigma + 0.01);
        }
    }

    [Fact]
    public void WheelspinIsFoundAndDoesNotInflateTheDistance()
    {
        // A driven-wheel pickup: the wheel spins up to 1.5 m/s faster than the car for 0.6 s,
        // adding 1.5 × 0.6 / 2 = 0.45 m of pulses the car never covered.
        Motion motion = QuarterMileLaunch();
        var synthetic = new SyntheticRun { Motion = motion, Seed = 12, SpinPeakMps = 1.5, SpinStartS = StartS + 0.5, SpinLengthS = 0.6 };
        ReconstructedRun run = SyntheticRun.Reconstruct(synthetic.Build());

        Assert.NotEmpty(run.WheelspinWindows);
        Assert.Contains(run.WheelspinWindows, w => w.StartS < StartS + 1.1 && w.EndS > StartS + 0.5);
        Assert.Contains(run.Warnings, w => w.Contains("wheelspin"));

        // 60 ft and the quarter mile measured on the car, not on the spinning wheel: 0.45 m at
        // 60 ft is about 50 ms, so a 5-ms tolerance shows the spin was taken out.
        double sixtyFeet = 60 * TrajectoryProbe.Foot;
        Assert.InRange(TrajectoryProbe.TimeToDistance(run, sixtyFeet, 0) - motion.TimeAtDistance(sixtyFeet)!.Value, -0.005, 0.005);
        Assert.InRange(TrajectoryProbe.TimeToDistance(run, TrajectoryProbe.QuarterMile, 0) - motion.TimeAtDistance(TrajectoryProbe.QuarterMile)!.Value, -0.005, 0.005);
    }

    [Fact]
    public void DriveSlipOfADrivenWheelIsEstimatedAndTakenOut()
    {
        // A driven wheel slipping 0.5 % per m/s² of drive (2.5 % at 5 m/s²) counts 1–2 % more
        // distance than the car covers; by the quarter mile that is metres.
        Motion motion = QuarterMileLaunch();
        var synthetic = new SyntheticRun { Motion = motion, Seed = 18, DriveSlipPerMps2 = 0.005 };
        DecodedRun input = synthetic.Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input);
        ReconstructedRun ignoringSlip = SyntheticRun.Reconstruct(input, new ReconstructionOptions { WheelSlipSigma = 0 });

        Assert.InRange(run.WheelSlipPerMps2!.Value.Value, 0.004, 0.006);
        Assert.Contains(run.Warnings, w => w.Contains("slipping"));
        double truth = motion.TimeAtDistance(TrajectoryProbe.QuarterMile)!.Value;
        double error = TrajectoryProbe.TimeToDistance(run, TrajectoryProbe.QuarterMile, 0) - truth;
        double uncorrected = TrajectoryProbe.TimeToDistance(ignoringSlip, TrajectoryProbe.QuarterMile, 0) - truth;
        Assert.InRange(error, -0.01, 0.01);
        Assert.True(Math.Abs(uncorrected) > 5 * Math.Abs(error), $"corrected {error * 1e3:F1} ms, uncorrected {uncorrected * 1e3:F1} ms");

        // The claimed σ covers what the linear slip law leaves.
        double sigma = TrajectoryProbe.At(run.Trajectory, run.Trajectory.DistanceSigmaM!, truth) / motion.At(truth).V;
        Assert.InRange(Math.Abs(error), 0, 2 * sigma);
    }

    [Fact]
    public void AnUndrivenWheelIsTakenAsNotSlipping()
    {
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = QuarterMileLaunch(), Seed = 19 }.Build());

        Assert.Equal(new Estimate(0, 0), run.WheelSlipPerMps2);
        Assert.DoesNotContain(run.Warnings, w => w.Contains("slipping"));
    }

    [Fact]
    public void TheUndrivenOfTwoChannelsMeasuresDistance()
    {
        // Channel 0 on a driven wheel slipping 1 % per m/s² (5 % at 5 m/s²), channel 1 on an
        // undriven wheel: the one that turns less under drive is the true measure.
        Motion motion = QuarterMileLaunch();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 20, DriveSlipPerMps2 = 0.01, SecondTeeth = 48 }.Build());

        Assert.Equal(1, run.DistanceChannel);
        Assert.Contains(run.Warnings, w => w.Contains("second pulse channel"));
        Assert.InRange(TrajectoryProbe.TimeToDistance(run, TrajectoryProbe.QuarterMile, 0) - motion.TimeAtDistance(TrajectoryProbe.QuarterMile)!.Value, -0.005, 0.005);
    }

    [Fact]
    public void SustainedWheelspinHandsDistanceToTheAccelerometer()
    {
        // Slip of 10 % per m/s² — the wheel spinning half as fast again as the car at 5 m/s² —
        // is no longer a tyre's slip but wheelspin all the way: distance under drive comes from
        // the accelerometer. Its error over the quarter mile stays within tens of milliseconds,
        // against seconds for the spinning wheel's count.
        Motion motion = QuarterMileLaunch();
        DecodedRun input = new SyntheticRun { Motion = motion, Seed = 21, DriveSlipPerMps2 = 0.1 }.Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input);
        ReconstructedRun naive = NaiveReconstruction.Reconstruct(input);

        Assert.Contains(run.Warnings, w => w.Contains("sustained wheelspin"));
        double truth = motion.TimeAtDistance(TrajectoryProbe.QuarterMile)!.Value - StartS;
        double error = TrajectoryProbe.TimeToDistance(run, TrajectoryProbe.QuarterMile, run.FirstMotionS.Value) - truth;
        double naiveError = TrajectoryProbe.TimeToDistance(naive, TrajectoryProbe.QuarterMile, naive.FirstMotionS.Value) - truth;
        Assert.InRange(error, -0.05, 0.05);
        Assert.True(Math.Abs(naiveError) > 10 * Math.Abs(error), $"ours {error * 1e3:F1} ms, naive {naiveError * 1e3:F1} ms");
    }

    [Fact]
    public void AWheelSlidingUnderBrakingIsFound()
    {
        // Under braking the wheel falls up to 3 m/s behind the car for half a second.
        Motion motion = HalfGToSixtyAndStop();
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = motion, Seed = 22, SpinPeakMps = -3, SpinStartS = StartS + 8, SpinLengthS = 0.5 }.Build());

        Assert.Contains(run.Warnings, w => w.Contains("slid"));
        Assert.Contains(run.WheelspinWindows.Concat(run.BrakingSlideWindows), w => w.StartS < StartS + 8.5 && w.EndS > StartS + 8);
        Assert.InRange(run.Trajectory.DistanceM[^1] - motion.At(motion.EndS).D, -0.1, 0.1);
    }

    [Fact]
    public void AWheelSlidingThroughAFirmStopKeepsTheStoppingDistance()
    {
        // From 0.5 g for 6 s (29.42 m/s) braking at 6 m/s² to rest; the pickup wheel falls up to
        // 3 m/s behind the car for most of the stop, as under ABS. Stopping distance at constant
        // deceleration: v²/(2a) (kinematics, any textbook).
        Motion motion = HalfGToSixtyAndStop();
        double brakeS = StartS + 6;
        double fromMps = 0.5 * G0 * 6;
        double closedForm = fromMps * fromMps / (2 * 6);
        var synthetic = new SyntheticRun { Motion = motion, Seed = 23, SpinPeakMps = -3, SpinStartS = brakeS + 0.05, SpinLengthS = 4.3 };
        ReconstructedRun run = SyntheticRun.Reconstruct(synthetic.Build());
        ReconstructedRun pulsesThrough = SyntheticRun.Reconstruct(synthetic.Build(), new ReconstructionOptions { BrakingDecelMps2 = 0, DetectWheelspin = false });

        Assert.Contains(run.Warnings, w => w.Contains("slid under braking"));
        Trajectory t = run.Trajectory;
        double ours = t.DistanceM[^1] - TrajectoryProbe.At(t, t.DistanceM, brakeS);
        double naive = pulsesThrough.Trajectory.DistanceM[^1] - TrajectoryProbe.At(pulsesThrough.Trajectory, pulsesThrough.Trajectory.DistanceM, brakeS);
        Assert.Equal(72.128, closedForm, 3);
        Assert.InRange(ours - closedForm, -0.15, 0.15);
        Assert.True(Math.Abs(naive - closedForm) > 1, $"pulses through the slide: {naive - closedForm:F2} m");
        Assert.InRange(Math.Abs(ours - closedForm), 0, 3 * t.DistanceSigmaM![^1]);
        Assert.InRange(run.StopS!.Value - motion.EndS, -0.01, 0.01);
    }

    [Fact]
    public void AWheelKeepingUpUnderBrakingKeepsItsPulses()
    {
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = HalfGToSixtyAndStop(), Seed = 24 }.Build());

        Assert.DoesNotContain(run.Warnings, w => w.Contains("slid"));
        Assert.Empty(run.WheelspinWindows);
    }

    [Fact]
    public void RestingLevelAndPitchComeFromTheStillSamples()
    {
        var synthetic = new SyntheticRun { Motion = HalfGToSixtyAndStop(), Seed = 13 };
        ReconstructedRun run = SyntheticRun.Reconstruct(synthetic.Build());

        // At rest the forward axis reads g·sin(pitch) plus its offset (specific force, level ground).
        double expectedLevel = (G0 * Math.Sin(synthetic.PitchRad)) + synthetic.AccelBiasMps2;
        Assert.InRange(run.RestingForwardMps2!.Value.Value - expectedLevel, -0.005, 0.005);
        Assert.InRange(run.RestingPitchRad!.Value.Value - Math.Asin(expectedLevel / G0), -0.001, 0.001);
        Assert.NotNull(run.AccelBiasMps2);
    }

    [Fact]
    public void WideBracketsAreReported()
    {
        ReconstructedRun run = SyntheticRun.Reconstruct(new SyntheticRun { Motion = HalfGToSixtyAndStop(), Seed = 14, PollPeriodS = 0.003 }.Build());

        Assert.Contains(run.Warnings, w => w.Contains("wider than 2.0 ms"));
        Assert.InRange(run.RolloutTimeS!.Value.Value - (StartS + 0.35260), -0.003, 0.003);
    }

    [Fact]
    public void AFirmwareRolloutMarkFarFromOursIsReported()
    {
        // The box's mark is judged once, by the verdict's window (pulse spacing and slip), not by a
        // second rule in the reconstruction: 0.3526 s is the exact 0.5 g rollout (REFERENCES.md),
        // 0.45 s is almost 100 ms late.
        Motion motion = HalfGToSixtyAndStop();
        Verdict Judge(double firmwareRolloutS) => SessionAnalyzer.Analyze(
            [new SyntheticRun { Motion = motion, Seed = 15, FirmwareRolloutS = firmwareRolloutS }.Build()]).Runs.Single().Verdict!;

        Assert.DoesNotContain(Judge(StartS + 0.3526).Reasons, r => r.Code == "rollout_marks_disagree");
        Assert.Contains(Judge(StartS + 0.45).Reasons, r => r.Code == "rollout_marks_disagree");
    }

    [Fact]
    public void ARunOpenedWhileRollingCountsFromItsFirstPulse()
    {
        Motion motion = Motion.FromRestAt(StartS).Accelerate(3, 3).Cruise(2);
        DecodedRun input = new SyntheticRun { Motion = motion, Seed = 16, Staged = false } .Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input);

        Assert.Equal(input.Pulses[0].MidS, run.FirstMotionS.Value, 6);
        Assert.Contains(run.Warnings, w => w.Contains("rolling"));
        Assert.InRange(TrajectoryProbe.SpeedAt(run.Trajectory, StartS + 4) - 9.0, -0.03, 0.03);
    }

    [Fact]
    public void NoDataGivesAWarningNotAnException()
    {
        var empty = new DecodedRun { Source = "empty", Configuration = new RunConfiguration { OpenedS = 2.0 }, Pulses = [] };
        ReconstructedRun run = SyntheticRun.Reconstruct(empty);

        Assert.Single(run.Warnings);
        Assert.Equal(2.0, run.FirstMotionS.Value);
        Assert.Null(run.RolloutTimeS);
    }

    [Fact]
    public void ThrowsOnANullRun()
    {
        Assert.Throws<ArgumentNullException>(() => SyntheticRun.Reconstruct(null!));
    }

    [Fact]
    public void OptionsCanSwitchTheAccelerometerOffAndMoveTheRollout()
    {
        DecodedRun input = new SyntheticRun { Motion = HalfGToSixtyAndStop(), Seed = 17 }.Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input, new ReconstructionOptions { UseAccelerometer = false, RolloutM = 1.0 });

        Assert.Equal(ReconstructionMethod.PulsesOnly, run.Method);
        Assert.Equal(1.0, run.RolloutM);

        // d = a·t²/2 = 1 m after √(2/4.903325) = 0.63866 s; the pulses-only σ sets the tolerance.
        Assert.InRange(run.RolloutTimeS!.Value.Value - (StartS + 0.63866), -3 * run.RolloutTimeS.Value.Sigma, 3 * run.RolloutTimeS.Value.Sigma);
    }
}
