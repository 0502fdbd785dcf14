using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Tests.Metrics;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>The stop finder at the edges of its rules, on closed-form stops
/// (<see cref="ClosedFormTrajectory.Stop"/>; kinematics, any textbook).</summary>
public class BrakingAnalyzerEdgeTests
{
    [Fact]
    public void ThreeSamplesAreTheFewestAStopIsMeasuredFrom()
    {
        // 8 m/s² from 10 m/s at 0 s, sampled at 0, 1 and 2 s: v = 10, 2, 0; d = 0, 6, 6.25
        // (v·t − a·t²/2, standing from 1.25 s). Switch at 0 s: v²/(2a) = 6.25 m; linear
        // interpolation to the 0.05 m/s standstill costs under 1 cm here.
        var three = new Trajectory { TimeS = [0, 1, 2], DistanceM = [0, 6, 6.25], SpeedMps = [10, 2, 0], AccelMps2 = [-8, -8, 0] };
        BrakingResult r = BrakingAnalyzer.Analyze(three, [0.0])!;
        Assert.Equal(10, r.FromMps, 9);
        Assert.Equal(6.25, r.StoppingDistanceM.Value, 0.01);

        var two = new Trajectory { TimeS = [0, 1.25], DistanceM = [0, 6.25], SpeedMps = [10, 0], AccelMps2 = [-8, 0] };
        Assert.Null(BrakingAnalyzer.Analyze(two, [0.0]));
    }

    [Fact]
    public void ASwitchClosingExactlyHalfASecondBeforeTheTopSpeedCountsAndOneAtStandstillDoesNot()
    {
        // Drive at 1 m/s² until 3 s (the top speed), coast, brakes at 3.5 s: the switch's window
        // is [top speed − 0.5 s, standstill), closed at its start and open at its end.
        Trajectory stop = DriveCoastStop();
        double topS = stop.TimeS[Array.IndexOf(stop.SpeedMps, stop.SpeedMps.Max())];
        BrakingResult atStart = BrakingAnalyzer.Analyze(stop, [topS - 0.5])!;
        Assert.Equal("brake switch", atStart.OnsetMethod);
        Assert.Equal(topS - 0.5, atStart.OnsetS.Value, 12);

        double standstill = BrakingAnalyzer.Analyze(stop)!.StandstillS;
        BrakingResult atEnd = BrakingAnalyzer.Analyze(stop, [standstill])!;
        Assert.Equal("deceleration onset", atEnd.OnsetMethod);
        Assert.Equal(3.5, atEnd.OnsetS.Value, 0.003);
    }

    [Fact]
    public void ATrajectoryWithoutAccelerationStillGivesAFiniteSigma()
    {
        // Speed and distance only (the acceleration series all zero), pulses' position σ 1 mm:
        // no deceleration to time, so the onset is the top speed, where the drive turned into the
        // stop (3 s here), and its σ stays finite.
        Trajectory stop = ClosedFormTrajectory.Stop(25, 1.0, [new StopPhase(-1, 0, 2.0), new StopPhase(8, 0, 0)]);
        var flat = new Trajectory { TimeS = stop.TimeS, DistanceM = stop.DistanceM, SpeedMps = stop.SpeedMps, AccelMps2 = new double[stop.Count] };
        BrakingResult r = BrakingAnalyzer.Analyze(flat, pulsePositionSigmaM: 0.001)!;
        Assert.True(double.IsFinite(r.OnsetS.Sigma) && double.IsFinite(r.StoppingDistanceM.Sigma), $"σ {r.OnsetS.Sigma} s, {r.StoppingDistanceM.Sigma} m");
        Assert.InRange(Math.Abs(r.OnsetS.Value - 3.0), 0, 3 * r.OnsetS.Sigma);
    }

    [Fact]
    public void AnAccelerometerTooCoarseForTheStopLeavesTheOnsetAtTheTopSpeed()
    {
        // Drive at 1 m/s² from 1 s to 8 s (20 → 27 m/s), then 8 m/s² to standstill at 11.375 s.
        // The accelerometer's own record has one sample a second: fewer than five within the
        // stop, too few to draw a rise through. The onset falls back to the top speed, where the
        // brakes came on (8 s), with a σ well under the accelerometer's 1-s step.
        Trajectory stop = ClosedFormTrajectory.Stop(20, 1.0, [new StopPhase(-1, 0, 7.0), new StopPhase(8, 0, 0)]);
        double[] rawT = [.. Enumerable.Range(0, 13).Select(i => (double)i)];
        double[] rawA = [.. rawT.Select(t => stop.ValueAt(stop.AccelMps2, t))];
        BrakingResult r = BrakingAnalyzer.Analyze(stop, rawAccel: (rawT, rawA))!;
        Assert.Equal("deceleration onset", r.OnsetMethod);
        Assert.Equal(8.0, r.OnsetS.Value, 0.001);
        Assert.InRange(r.OnsetS.Sigma, 0.001, 0.1);
    }

    [Fact]
    public void MfddOnACoarseTrajectoryAfterAnEarlierSlowingIsTheStopsOwn()
    {
        // Cruise at 22 m/s, slow at 5 m/s² for 2 s (to 12 m/s, under the MFDD window's 0.8·v),
        // speed up at 5 m/s² for 2.6 s (to 25 m/s), then 8 m/s² to standstill from 5.6 s; the
        // trajectory sampled every 50 ms. UN R13-H Annex 3 MFDD of a constant deceleration is that
        // deceleration (shared REFERENCES.md); stopping distance v²/(2a) = 39.0625 m. Linear
        // interpolation between 50-ms samples costs at most a·h²/8 = 2.5 mm at each end
        // (0.002 m/s² of MFDD): tolerances 0.01 m and 0.01 m/s².
        Trajectory fine = ClosedFormTrajectory.Stop(22, 1.0, [new StopPhase(5, 0, 2.0), new StopPhase(-5, 0, 2.6), new StopPhase(8, 0, 0)]);
        int[] keep = [.. Enumerable.Range(0, fine.Count).Where(i => i % 100 == 0)];
        var coarse = new Trajectory
        {
            TimeS = [.. keep.Select(i => fine.TimeS[i])],
            DistanceM = [.. keep.Select(i => fine.DistanceM[i])],
            SpeedMps = [.. keep.Select(i => fine.SpeedMps[i])],
            AccelMps2 = [.. keep.Select(i => fine.AccelMps2[i])],
        };
        BrakingResult r = BrakingAnalyzer.Analyze(coarse, [5.6])!;
        Assert.Equal(25, r.FromMps, 0.001);
        Assert.Equal(25.0 * 25 / 16, r.StoppingDistanceM.Value, 0.01);
        Assert.Equal(8, r.MfddMps2!.Value, 0.01);
    }

    [Fact]
    public void APumpedPedalIsTimedFromItsFirstPress()
    {
        // Cadence braking from 25 m/s: from 2.0 s the pedal is pressed and released every 0.3 s
        // (0.03-s rises to 8 m/s², 0.12 s held, 0.03-s falls to 0.5 m/s², 0.12 s released), so
        // no press holds past half the stop's deceleration for 0.2 s. The brakes came on at the
        // first press (closed form, by construction); timed at the last one, the onset was 5.7 s
        // late. Measured error 2 ms against a σ of 5.7 ms: within 3σ.
        var phases = new List<StopPhase>();
        for (int k = 0; k < 40; k++)
        {
            phases.Add(new StopPhase(0.5, 7.5 / 0.03, 0.03));
            phases.Add(new StopPhase(8, 0, 0.12));
            phases.Add(new StopPhase(8, -7.5 / 0.03, 0.03));
            phases.Add(new StopPhase(0.5, 0, 0.12));
        }

        phases.Add(new StopPhase(0.5, 0, 0));
        Trajectory stop = ClosedFormTrajectory.Stop(25, 2.0, [.. phases]);
        BrakingResult r = BrakingAnalyzer.Analyze(stop)!;
        Assert.Equal("deceleration onset", r.OnsetMethod);
        Assert.InRange(Math.Abs(r.OnsetS.Value - 2.0), 0, 3 * r.OnsetS.Sigma);
        Assert.InRange(r.OnsetS.Sigma, 0.001, 0.02);
    }

    [Theory]
    [InlineData(0.05, 800)]
    [InlineData(0.1, 800)]
    [InlineData(0.1, 200)]
    public void A_speed_top_that_a_smoother_tipped_past_the_onset_does_not_hold_the_onset_back(double bumpMps2, double rateHz)
    {
        // Cruise at 25 m/s; the brakes come on at 2.0 s, the deceleration rising to 7 m/s² over
        // 0.3 s, then held to standstill (closed form, kinematics). The accelerometer's own record
        // is that motion sampled at rateHz. The trajectory it is placed on carries the kind of error
        // a fusion leaves on a flat top (a generated rolling start's, 0.04–0.09 m/s² over the last
        // 0.13 s before its onset): bumpMps2 of acceleration from 1.9 s on, so its highest speed,
        // 5–10 mm/s up, lies 2–4 ms after the onset. The line through the rise was clamped to the
        // top speed's sample and gave that instead (+2.5 and +5.0 ms); the rise began at 2.0 s.
        const double Rise = 7 / 0.3;
        Trajectory truth = ClosedFormTrajectory.Stop(25, 2.0, [new StopPhase(0, Rise, 0.3), new StopPhase(7, 0, 0)]);
        Trajectory tipped = ClosedFormTrajectory.Stop(25, 1.9, [new StopPhase(-bumpMps2, 0, 0.1), new StopPhase(-bumpMps2, Rise, 0.3), new StopPhase(7, 0, 0)]);
        double topS = tipped.TimeS[Array.IndexOf(tipped.SpeedMps, tipped.SpeedMps.Max())];
        Assert.InRange(topS - 2.0, 0.002, 0.005);
        double[] rawT = [.. Enumerable.Range(0, (int)(truth.TimeS[^1] * rateHz)).Select(i => i / rateHz)];
        double[] rawA = [.. rawT.Select(t => truth.ValueAt(truth.AccelMps2, t))];

        BrakingResult r = BrakingAnalyzer.Analyze(tipped, rawAccel: (rawT, rawA))!;

        Assert.Equal("deceleration onset", r.OnsetMethod);
        Assert.InRange(r.OnsetS.Value - 2.0, -0.001, 0.001);
    }

    /// <summary>Cruise at 25 m/s to 1 s, drive at 1 m/s² to 3 s, coast at 0.7 m/s² for 0.5 s,
    /// then a brake rise to 5 m/s² over 0.2 s and a constant 5 m/s² to standstill.</summary>
    private static Trajectory DriveCoastStop() =>
        ClosedFormTrajectory.Stop(25, 1.0, [new StopPhase(-1, 0, 2.0), new StopPhase(0.7, 0, 0.5), new StopPhase(0.7, (5 - 0.7) / 0.2, 0.2), new StopPhase(5, 0, 0)]);
}
