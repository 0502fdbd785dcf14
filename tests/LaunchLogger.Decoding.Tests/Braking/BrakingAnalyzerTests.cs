using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Tests.Metrics;

namespace LaunchLogger.Decoding.Tests.Braking;

public class BrakingAnalyzerTests
{
    private const double V100 = 100 / 3.6; // 100 km/h in m/s

    [Fact]
    public void ConstantDecelerationAfterDeadTimeFromTheBrakeSwitch()
    {
        // UN R13 worked check (shared REFERENCES.md): 100 km/h, 0.3 s dead time then 8 m/s² →
        // MFDD 8.0000. Stopping distance by kinematics: v·0.3 + v²/(2·8) = 8.3333 + 48.2253 m.
        Trajectory trajectory = Stop(V100, switchAtS: 1.0, deadTimeS: 0.3, rampS: 0, decel: 8);
        BrakingResult result = BrakingAnalyzer.Analyze(trajectory, brakeSwitchOnS: [1.0])!;

        Assert.Equal("brake switch", result.OnsetMethod);
        Assert.Equal(V100, result.FromMps, 6);
        Assert.Equal((V100 * 0.3) + (V100 * V100 / 16), result.StoppingDistanceM.Value, 2);
        Assert.Equal(8.0, result.MfddMps2!.Value, 2);
        Assert.Equal(V100 * V100 / (2 * result.StoppingDistanceM.Value), result.MeanDecelMps2, 9);
        Assert.Equal(8.0, result.PeakDecelMps2, 6);
    }

    [Fact]
    public void WithoutASwitchTheOnsetIsBackExtrapolatedFromTheDecelerationRise()
    {
        // A linear rise of deceleration from 0 at 1.3 s to 8 m/s² at 1.5 s: the fitted line
        // crosses zero where the rise began.
        Trajectory trajectory = Stop(V100, switchAtS: 1.0, deadTimeS: 0.3, rampS: 0.2, decel: 8);
        BrakingResult result = BrakingAnalyzer.Analyze(trajectory)!;
        Assert.Equal("deceleration onset", result.OnsetMethod);
        Assert.Equal(1.3, result.OnsetS.Value, 3);
        Assert.InRange(result.OnsetS.Sigma, 1e-4, 0.015);
    }

    [Theory]
    [InlineData(0.05)]
    [InlineData(0.3)]
    [InlineData(1.0)]
    [InlineData(2.0)]
    public void TheOnsetOfASlowOrFastRiseIsFoundWhereTheRiseBegins(double rampS)
    {
        // Cruise at 60 mph, then deceleration rising linearly to 8 m/s² over rampS from 2.0 s.
        // Closed form (constant jerk, then constant deceleration; kinematics, any textbook):
        // stopping distance = v0·T − j·T³/6 + v(T)²/(2·8), j = 8/T, v(T) = v0 − 8·T/2.
        const double V0 = 60 * 0.44704;
        Trajectory trajectory = Stop(V0, switchAtS: 2.0, deadTimeS: 0, rampS: rampS, decel: 8);
        BrakingResult result = BrakingAnalyzer.Analyze(trajectory)!;
        double vT = V0 - (8 * rampS / 2);
        double expected = (V0 * rampS) - (8 / rampS * rampS * rampS * rampS / 6) + (vT * vT / 16);
        Assert.Equal(2.0, result.OnsetS.Value, 0.001);
        Assert.Equal(expected, result.StoppingDistanceM.Value, 0.03);
        Assert.Equal(V0, result.FromMps, 0.01);
    }

    [Fact]
    public void TheOnsetOfARiseThatLastsTheWholeStopIsWhereTheRiseBegins()
    {
        // Deceleration rising at 4 m/s³ from 2.0 s until the car stops (no plateau): with
        // j = 4, v(s) = v0 − j·s²/2 reaches 0 at s = √(2·v0/j), distance v0·s − j·s³/6.
        const double V0 = 60 * 0.44704;
        const double J = 4;
        double stopS = Math.Sqrt(2 * V0 / J);
        Trajectory trajectory = Stop(V0, switchAtS: 2.0, deadTimeS: 0, rampS: 10, decel: 40);
        BrakingResult result = BrakingAnalyzer.Analyze(trajectory)!;
        Assert.Equal(2.0, result.OnsetS.Value, 0.001);
        Assert.Equal((V0 * stopS) - (J * stopS * stopS * stopS / 6), result.StoppingDistanceM.Value, 0.03);
    }

    [Fact]
    public void ALiftOffIntoACoastIsNotTakenForTheOnsetWhenTheBoxIsTilted()
    {
        // Drive at 1 m/s² for 2 s, lift off into a 0.5 s coast at 0.7 m/s² (drag), then the
        // brakes: a rise to 5 m/s² over 0.2 s. Closed form (piecewise constant jerk; kinematics):
        // onset at 1 + 2 + 0.5 = 3.5 s. The accelerometer is tilted nose down by 3.3°, so its own
        // samples read g0·sin 3.3° = 0.56 m/s² lower throughout: the coast then reads 1.26 m/s²,
        // more than 20 % of the stop, and a line through the rise walked back through the coast
        // to the lift-off, 0.5 s early (seen on the simulator's club-hatch runs).
        Trajectory trajectory = DriveCoastStop(liftOffS: 3.0, coastS: 0.5);
        double[] raw = [.. trajectory.AccelMps2.Select(a => a - 0.56)];
        BrakingResult result = BrakingAnalyzer.Analyze(trajectory, rawAccel: (trajectory.TimeS, raw))!;
        Assert.Equal("deceleration onset", result.OnsetMethod);
        Assert.Equal(3.5, result.OnsetS.Value, 0.003);
        Assert.InRange(Math.Abs(result.OnsetS.Value - 3.5), 0, 3 * result.OnsetS.Sigma);
    }

    [Fact]
    public void ABriefSwingAtALiftOffIsNotTakenForTheRise()
    {
        // The same drive, coast and stop read off a trajectory smoothed from pulses alone: the
        // smoother meets the lift-off with a swing to −6 m/s² for 60 ms (seen on the simulator's
        // pulses-only runs), deeper than half the stop's 5 m/s² but gone long before the brakes.
        Trajectory smooth = DriveCoastStop(liftOffS: 3.0, coastS: 0.5);
        double[] a = [.. smooth.AccelMps2];
        for (int i = 0; i < a.Length; i++)
        {
            if (smooth.TimeS[i] >= 3.0 && smooth.TimeS[i] < 3.06)
            {
                a[i] = -6;
            }
        }

        var swung = new Trajectory { TimeS = smooth.TimeS, DistanceM = smooth.DistanceM, SpeedMps = smooth.SpeedMps, AccelMps2 = a };
        BrakingResult result = BrakingAnalyzer.Analyze(swung)!;
        Assert.Equal(3.5, result.OnsetS.Value, 0.003);
    }

    [Fact]
    public void StopsNearTheNominalSpeedAreCorrectedAndOthersAreNot()
    {
        // 101.5 km/h is within 10 % of 100 km/h and of 60 mph (96.56 km/h); 130 km/h is not.
        Trajectory near = Stop(101.5 / 3.6, switchAtS: 1.0, deadTimeS: 0, rampS: 0, decel: 9);
        BrakingResult nearResult = BrakingAnalyzer.Analyze(near, [1.0])!;
        CorrectedStop to100 = nearResult.CorrectedStops.Single(c => c.Label == "100-0 km/h");
        // Common practice (v_nom/v_act)² scaling.
        Assert.Equal(nearResult.StoppingDistanceM.Value * Math.Pow(100 / 101.5, 2), to100.CorrectedDistanceM!.Value, 6);
        Assert.Contains("(nominal ÷ actual speed at onset)²", to100.Method);

        Trajectory far = Stop(130 / 3.6, switchAtS: 1.0, deadTimeS: 0, rampS: 0, decel: 9);
        CorrectedStop farTo100 = BrakingAnalyzer.Analyze(far, [1.0])!.CorrectedStops.Single(c => c.Label == "100-0 km/h");
        Assert.Null(farTo100.CorrectedDistanceM);
        Assert.Contains("not corrected", farTo100.Method);
    }

    [Fact]
    public void TractionBoundFollowsTheMeanDeceleration()
    {
        // Kinematics: a stop with mean deceleration a bounds 0–v at v/a.
        Trajectory trajectory = Stop(60 * 0.44704, switchAtS: 1.0, deadTimeS: 0, rampS: 0, decel: 11.8019);
        BrakingResult result = BrakingAnalyzer.Analyze(trajectory, [1.0])!;
        Assert.Equal(60 * 0.44704 / result.MeanDecelMps2, result.TractionBound0To60S, 9);
        Assert.Equal(2.2727, result.TractionBound0To60S, 3); // shared REFERENCES.md: 100 ft from 60 mph
    }

    [Fact]
    public void ARunThatDoesNotEndStandingHasNoStop()
    {
        Trajectory rolling = Stop(V100, switchAtS: 1.0, deadTimeS: 0, rampS: 0, decel: 8, endEarlyS: 1.2);
        Assert.Null(BrakingAnalyzer.Analyze(rolling, [1.0]));
    }

    /// <summary>Cruise at 25 m/s to 1 s, drive at 1 m/s² to <paramref name="liftOffS"/>, coast at
    /// 0.7 m/s² for <paramref name="coastS"/>, then a brake rise to 5 m/s² over 0.2 s and a
    /// constant 5 m/s² to standstill.</summary>
    private static Trajectory DriveCoastStop(double liftOffS, double coastS) =>
        ClosedFormTrajectory.Stop(25, 1.0, [new StopPhase(-1, 0, liftOffS - 1), new StopPhase(0.7, 0, coastS), new StopPhase(0.7, (5 - 0.7) / 0.2, 0.2), new StopPhase(5, 0, 0)]);

    /// <summary>Cruise at <paramref name="v0"/>, brake switch at <paramref name="switchAtS"/>, dead
    /// time, a linear rise of deceleration over <paramref name="rampS"/>, then constant
    /// deceleration to standstill and 1 s standing (<see cref="ClosedFormTrajectory.Stop"/>).</summary>
    private static Trajectory Stop(double v0, double switchAtS, double deadTimeS, double rampS, double decel, double endEarlyS = 0)
    {
        var phases = new List<StopPhase>();
        if (deadTimeS > 0)
        {
            phases.Add(new StopPhase(0, 0, deadTimeS));
        }

        if (rampS > 0)
        {
            phases.Add(new StopPhase(0, decel / rampS, rampS));
        }

        phases.Add(new StopPhase(decel, 0, 0));
        return ClosedFormTrajectory.Stop(v0, switchAtS, [.. phases], endEarlyS > 0 ? switchAtS + endEarlyS : null);
    }
}
