using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The events stage on trajectories written directly: a launch at constant acceleration
/// from a known first motion, with constant σ columns.</summary>
public class EventFinderTests
{
    private const double FirstMotionS = 1.0;
    private const double AccelMps2 = 3.0;
    private const double DistanceSigmaM = 0.01;
    private const double RolloutM = 0.3048; // one foot, the trade's rollout (common practice)

    [Fact]
    public void TheRolloutMarkIsWhereTheConstantAccelerationLaunchCoversOneFoot()
    {
        (Estimate? time, Estimate? speed) = EventFinder.Rollout(Launch(endS: 3), FirstMotionS, RolloutM);

        // Constant acceleration from rest: d = a·t²/2, so one foot takes √(2d/a) and the speed
        // there is a·t (kinematics, closed form).
        double after = Math.Sqrt(2 * RolloutM / AccelMps2);
        Assert.NotNull(time);
        Assert.NotNull(speed);
        Assert.Equal(FirstMotionS + after, time.Value.Value, 1e-5);
        Assert.Equal(AccelMps2 * after, speed.Value.Value, 1e-4);

        // First-order propagation of the distance's σ to the time a distance is reached:
        // σ_t = σ_d / v (JCGM 100:2008, GUM, 5.1.2).
        Assert.Equal(DistanceSigmaM / (AccelMps2 * after), time.Value.Sigma, 1e-6);
    }

    [Fact]
    public void ARunThatNeverCoversTheRolloutHasNoMark()
    {
        // 0.3 s at 3 m/s² covers 0.135 m.
        (Estimate? time, Estimate? speed) = EventFinder.Rollout(Launch(endS: FirstMotionS + 0.3), FirstMotionS, RolloutM);

        Assert.Null(time);
        Assert.Null(speed);
    }

    [Fact]
    public void AnAccelerometerOnlyRunThatEndsAtRestSaysTheWorstSpeedUncertainty()
    {
        List<string> notes = EventFinder.ModeWarnings(Launch(endS: 3), new Estimate(FirstMotionS, 0), stopS: 2.9, withPulses: false, withAccelerometer: true, staged: true);

        // The speed σ column rises to 0.02 m/s per second after first motion, 0.04 at 3 s.
        string note = Assert.Single(notes);
        Assert.StartsWith("accelerometer only", note, StringComparison.Ordinal);
        Assert.Contains("±0.04 m/s at worst", note, StringComparison.Ordinal);
    }

    [Fact]
    public void AnAccelerometerOnlyRunWithoutAStopSaysTheUncertaintyTenSecondsIn()
    {
        List<string> notes = EventFinder.ModeWarnings(Launch(endS: 15), new Estimate(FirstMotionS, 0), stopS: null, withPulses: false, withAccelerometer: true, staged: true);

        // 10 s after first motion the speed σ column reads 0.20 m/s and the distance σ 0.01 m.
        string note = Assert.Single(notes);
        Assert.Contains("after 10.0 s they are uncertain by ±0.20 m/s and ±0.0 m", note, StringComparison.Ordinal);
    }

    [Fact]
    public void APulsesOnlyStandingStartSaysFirstMotionIsBackExtrapolated()
    {
        List<string> notes = EventFinder.ModeWarnings(Launch(endS: 3), new Estimate(FirstMotionS, 0.012), stopS: 2.9, withPulses: true, withAccelerometer: false, staged: true);

        string note = Assert.Single(notes);
        Assert.Equal("no accelerometer: first motion is back-extrapolated from the first pulses (±12 ms)", note);
    }

    [Theory]
    [InlineData(true, true, null, 1)]
    [InlineData(true, true, 2.9, 0)]
    [InlineData(true, false, 2.9, 0)]
    public void OnlyARunWithPulsesAndNoStopIsToldItHasNoKnownStop(bool withAccelerometer, bool staged, double? stopS, int expected)
    {
        List<string> notes = EventFinder.ModeWarnings(Launch(endS: 3), new Estimate(FirstMotionS, 0.012), stopS, withPulses: true, withAccelerometer, staged: staged && withAccelerometer);

        Assert.Equal(expected, notes.Count(n => n.Contains("no known stop", StringComparison.Ordinal)));
        Assert.DoesNotContain(notes, n => n.StartsWith("accelerometer only", StringComparison.Ordinal));
    }

    /// <summary>At rest until first motion, then 3 m/s² to <paramref name="endS"/>, every 2 ms;
    /// distance σ 0.01 m throughout, speed σ growing by 0.02 m/s each second after first motion.</summary>
    private static Trajectory Launch(double endS)
    {
        int n = (int)Math.Round(endS / 0.002) + 1;
        var t = new double[n];
        var d = new double[n];
        var v = new double[n];
        var a = new double[n];
        var sd = new double[n];
        var sv = new double[n];
        for (int k = 0; k < n; k++)
        {
            t[k] = k * 0.002;
            double moving = Math.Max(t[k] - FirstMotionS, 0);
            d[k] = 0.5 * AccelMps2 * moving * moving;
            v[k] = AccelMps2 * moving;
            a[k] = moving > 0 ? AccelMps2 : 0;
            sd[k] = DistanceSigmaM;
            sv[k] = 0.02 * moving;
        }

        return new Trajectory { TimeS = t, DistanceM = d, SpeedMps = v, AccelMps2 = a, DistanceSigmaM = sd, SpeedSigmaMps = sv };
    }
}
