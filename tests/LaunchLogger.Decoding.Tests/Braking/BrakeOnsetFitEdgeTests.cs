using LaunchLogger.Decoding.Braking;
using Signal = LaunchLogger.Decoding.Tests.Braking.BrakeOnsetFitTests.Signal;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>The ramp fit at the edges of its rules: how few samples it times, where its window
/// opens and closes, and whether its σ is as wide as its errors. Truth is the prescribed onset of
/// a piecewise-linear deceleration (closed form, by construction), with seeded white noise where
/// the σ is checked.</summary>
public class BrakeOnsetFitEdgeTests
{
    [Theory]
    [InlineData(0.1, 4.0037)]
    [InlineData(1.0, 4.0037)]
    [InlineData(0.1, 24.0037)]
    [InlineData(1.0, 24.0037)]
    public void TheSigmaOfANoisyRiseIsAsWideAsItsErrorsNoWiderNoNarrower(double riseS, double onsetS)
    {
        // White noise of 1 m/s² at 200 Hz (a rough road's vibration), 40 seeds; the stop 3 s after
        // the top speed, early in the record or after 21 s of it. A Gaussian σ holds the truth
        // within 1σ 68 % of the time and within 3σ 99.7 % (normal distribution, any statistics
        // text). Measured: 21–31 of 40 within 1σ, 39–40 within 3σ. The bounds, 14–36 within 1σ
        // (the binomial's ±4 standard deviations about 27) and at least 37 within 3σ, fail a σ
        // that is half or twice as wide.
        const int Seeds = 40;
        int inOne = 0, inThree = 0;
        for (int seed = 1; seed <= Seeds; seed++)
        {
            Signal s = Signal.Make(levelDecel: 0.3, onsetS: onsetS, riseS: riseS, plateauDecel: 7, standstillS: onsetS + 5, noise: 1.0, seed: seed);
            Estimate onset = BrakeOnsetFit.Fit(s.T, s.A, null, null, 0, onsetS - 3, s.StandstillS, out _)!.Value;
            double error = Math.Abs(onset.Value - onsetS);
            inOne += error <= onset.Sigma ? 1 : 0;
            inThree += error <= 3 * onset.Sigma ? 1 : 0;
        }

        Assert.InRange(inOne, 14, 36);
        Assert.InRange(inThree, 37, Seeds);
    }

    [Fact]
    public void NoiseAboutTheHalfWayPointOfASlowRiseIsNoSwingBeforeIt()
    {
        // A 1-s rise under 0.5 m/s² of noise crosses half its full deceleration more than once;
        // the window must still open before the rise, not at the last crossing (which timed
        // such stops 0.5 s late). Measured error at most 17 ms (σ about 18 ms) over 40 seeds.
        for (int seed = 1; seed <= 40; seed++)
        {
            Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 1.0, plateauDecel: 7, standstillS: 9, noise: 0.5, seed: seed);
            Estimate onset = BrakeOnsetFit.Fit(s.T, s.A, null, null, 0, 1.0, s.StandstillS, out double rise)!.Value;
            Assert.InRange(onset.Value - 4.0037, -0.06, 0.06);
            Assert.InRange(rise, 0.85, 1.15);
        }
    }

    [Fact]
    public void AStopLateInALongRecordIsTimedAlikeAndSoIsItsSigma()
    {
        // The same stop with the box's clock 1000 s further on: nothing but the clock differs,
        // so the onset moves by exactly 1000 s and the σ not at all.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9);
        double[] later = [.. s.T.Select(t => t + 1000)];
        Estimate early = BrakeOnsetFit.Fit(s.T, s.A, null, null, 0, s.PeakS, s.StandstillS, out _)!.Value;
        Estimate late = BrakeOnsetFit.Fit(later, s.A, null, null, 1000, s.PeakS + 1000, s.StandstillS + 1000, out _)!.Value;
        Assert.Equal(1004.0037, late.Value, 0.0005);
        Assert.Equal(early.Sigma, late.Sigma, 1e-6);
    }

    [Fact]
    public void TenSamplesAreTheFewestTimed()
    {
        // 10 Hz samples, a step from 0.3 to 7 m/s² at 0.35 s: with ten samples the step is placed
        // within the sample step (0.1 s) and σ at least the step over √12 (uniform rounding, any
        // statistics text); nine are too few.
        double[] t = [.. Enumerable.Range(0, 10).Select(i => i * 0.1)];
        double[] a = [.. t.Select(x => x < 0.35 ? -0.3 : -7.0)];
        Estimate ten = BrakeOnsetFit.Fit(t, a, null, null, 0, 0, 1.2, out _)!.Value;
        Assert.InRange(ten.Value, 0.3, 0.4);
        Assert.InRange(ten.Sigma, 0.1 / Math.Sqrt(12), 0.1);
        Assert.Null(BrakeOnsetFit.Fit(t[..9], a[..9], null, null, 0, 0, 1.2, out double rise));
        Assert.True(double.IsNaN(rise));
    }

    [Fact]
    public void AGentleDriveBeforeACoastIsLeftOutOfTheLevel()
    {
        // Drive at 0.4 m/s² until 3.5 s, a coast at 0.2 m/s² of drag (under the foot's 0.25),
        // brakes at 4.0037 s rising over 0.3 s. Fitted as one level, the drive would move the
        // onset; noise-free the fit places it within 0.5 ms (the FindsTheOnset… tolerance).
        Signal s = Signal.Make(levelDecel: 0.2, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9, driveUntilS: 3.5, driveMps2: 0.4);
        Estimate onset = BrakeOnsetFit.Fit(s.T, s.A, null, null, 0, s.PeakS, s.StandstillS, out double rise)!.Value;
        Assert.Equal(4.0037, onset.Value, 0.0005);
        Assert.Equal(0.3, rise, 0.006);
    }

    [Fact]
    public void ABriefSwingBeforeTheRiseIsLeftOutOfTheLevel()
    {
        // A lift-off jolt to 6 m/s² for 60 ms at 3.5 s (deeper than half the stop's 7 m/s², gone
        // long before the brakes at 4.0037 s): noise-free the onset within 0.5 ms.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9);
        double[] a = [.. s.A.Select((x, i) => s.T[i] >= 3.5 && s.T[i] < 3.56 ? -6 : x)];
        Estimate onset = BrakeOnsetFit.Fit(s.T, a, null, null, 0, s.PeakS, s.StandstillS, out _)!.Value;
        Assert.Equal(4.0037, onset.Value, 0.0005);
    }

    [Fact]
    public void StandingAfterAShortStopDoesNotMoveTheOnset()
    {
        // A stop of 1.5 s, then 1 s standing (no deceleration) in the same record: the fit ends
        // before standstill, so the onset is where the stop alone puts it (within 0.5 ms).
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 5.5);
        double[] t = [.. s.T, .. Enumerable.Range(0, 200).Select(i => 5.5 + (i / 200.0))];
        double[] a = [.. s.A, .. new double[200]];
        Estimate onset = BrakeOnsetFit.Fit(t, a, null, null, 0, s.PeakS, s.StandstillS, out double rise)!.Value;
        Assert.Equal(4.0037, onset.Value, 0.0005);
        Assert.Equal(0.3, rise, 0.006);
    }

    [Fact]
    public void ARecordThatOpensAsTheBrakesComeOnIsTimedAtItsFirstSample()
    {
        // The accelerometer's record begins at the onset (t = 2 s) and the rise takes 0.3 s:
        // nothing before it, so the onset is the first sample, within 0.5 ms.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 2.0, riseS: 0.3, plateauDecel: 7, standstillS: 6);
        int first = Array.FindIndex(s.T, t => t >= 2.0);
        Estimate onset = BrakeOnsetFit.Fit(s.T[first..], s.A[first..], null, null, 2.0, 2.0, s.StandstillS, out _)!.Value;
        Assert.Equal(2.0, onset.Value, 0.0005);
    }

    [Fact]
    public void ACoarseAccelerometerPlacedByAFineTrajectoryKeepsItsOwnClock()
    {
        // The window is placed on a 2 kHz trajectory, the fit runs on the accelerometer's own
        // 100 Hz samples of the same stop, tilted by 0.51 m/s²: both grids must be read on their
        // own times. A step is placed within a sample step (10 ms).
        Signal place = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9);
        double[] ft = [.. Enumerable.Range(0, 18000).Select(i => i / 2000.0)];
        double[] fa = [.. ft.Select(t => -Decel(t))];
        double[] ct = [.. Enumerable.Range(0, 900).Select(i => i / 100.0)];
        double[] ca = [.. ct.Select(t => -Decel(t) + 0.51)];
        Estimate onset = BrakeOnsetFit.Fit(ct, ca, ft, fa, 0, place.PeakS, place.StandstillS, out double rise)!.Value;
        Assert.Equal(4.0037, onset.Value, 0.0005);
        Assert.Equal(0.3, rise, 0.006);

        static double Decel(double t) => t < 4.0037 ? 0.3 : t < 4.3037 ? 0.3 + ((7 - 0.3) * (t - 4.0037) / 0.3) : 7;
    }

    [Fact]
    public void AnAccelerometerRecordTooCoarseForTheWindowGivesNoOnset()
    {
        // One sample a second: the window (3 s either side of the half-way point) holds fewer than
        // eight of them, too few to fit a level, a rise and a plateau.
        Signal place = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9);
        double[] ct = [.. Enumerable.Range(0, 12).Select(i => (double)i)];
        double[] ca = [.. ct.Select(t => t < 4.0037 ? -0.3 : -7.0)];
        Assert.Null(BrakeOnsetFit.Fit(ct, ca, place.T, place.A, 0, place.PeakS, place.StandstillS, out _));
    }
}
