using System.Globalization;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Metrics;

/// <summary>The figure code's rules one at a time, on closed-form launches (kinematics, any
/// textbook: v = a·τ, d = a·τ²/2). Launches at 8 m/s² sampled every 0.125 s from rest at 1 s
/// put 10 m/s exactly on a sample (τ = 1.25 s) and 9.5 m/s between two (τ = 1.1875 s).</summary>
public class FigureCalculatorRulesTests
{
    private const double A = 8;
    private const double T0 = 1;
    private const double Step = 0.125;

    [Fact]
    public void ASpeedReachedExactlyOnASampleIsTimedThereAndOneBetweenSamplesByInterpolation()
    {
        Trajectory t = Launch(endS: 5);
        FigureSet f = FigureCalculator.Compute(t, new Estimate(T0, 0), request: Request(new SpeedInterval("0-10", 0, 10), new SpeedInterval("0-9.5", 0, 9.5)));
        Assert.Equal(1.25, f.SpeedIntervals[0].FromStandstillS);
        Assert.Equal(1.1875, f.SpeedIntervals[1].FromStandstillS!.Value, 12);
    }

    [Fact]
    public void NothingReachedAfterBrakeOnsetIsTimedAndOnsetItselfStillCounts()
    {
        // 9.5 m/s falls at 2.1875 s, between the samples at 2.125 and 2.25 s.
        Trajectory t = Launch(endS: 5);
        FigureRequest request = Request(new SpeedInterval("0-9.5", 0, 9.5));
        Assert.Null(FigureCalculator.Compute(t, new Estimate(T0, 0), request: request, brakeOnsetS: 2.15).SpeedIntervals[0].FromStandstillS);
        Assert.Equal(1.1875, FigureCalculator.Compute(t, new Estimate(T0, 0), request: request, brakeOnsetS: 2.1875).SpeedIntervals[0].FromStandstillS!.Value, 12);
        Assert.Equal(1.1875, FigureCalculator.Compute(t, new Estimate(T0, 0), request: request, brakeOnsetS: 2.2).SpeedIntervals[0].FromStandstillS!.Value, 12);
    }

    [Theory]
    [InlineData(12.0, 0.02, true)]   // pulls on to 12 m/s: timed
    [InlineData(10.0, 0.02, false)]  // holds exactly 10 m/s: its crossing could be anywhere along the hold
    [InlineData(10.03, 0.02, false)] // tops out 1.5σ above: the car may never have reached 10 m/s
    [InlineData(10.05, 0.02, true)]  // 2.5σ above: reached
    [InlineData(10.0, 0, true)]      // an exact speed that reaches 10 m/s reaches it
    public void AnIntervalIsTimedOnlyWhenTheSpeedClearlyPassesItsEnd(double topMps, double speedSigma, bool timed)
    {
        // From rest at 1 s at 8 m/s² up to the top speed, then held there until 5 s.
        Trajectory launch = Launch(endS: 5, speedSigma: speedSigma);
        double[] v = [.. launch.SpeedMps.Select(x => Math.Min(x, topMps))];
        Trajectory held = new()
        {
            TimeS = launch.TimeS,
            DistanceM = launch.DistanceM,
            SpeedMps = v,
            AccelMps2 = [.. v.Select((x, i) => i > 0 && x > v[i - 1] ? A : 0)],
            SpeedSigmaMps = launch.SpeedSigmaMps,
        };

        FigureSet set = FigureCalculator.Compute(held, new Estimate(T0, 0), request: Request(new SpeedInterval("0-10", 0, 10)));
        IntervalFigure f = set.SpeedIntervals[0];

        Assert.Equal(timed, f.FromStandstillS.HasValue);

        // Declined intervals are listed with the top speed reached and the speed's σ, for the report's note.
        if (timed)
        {
            Assert.Empty(set.NotClearlyReached);
        }
        else
        {
            var declined = Assert.Single(set.NotClearlyReached);
            Assert.Equal("0-10", declined.Interval.Label);
            Assert.Equal(topMps, declined.TopMps, 9);
            Assert.Equal(speedSigma, declined.SigmaMps, 9);
        }

        if (timed)
        {
            Assert.Equal(10 / A, f.FromStandstillS!.Value, 9);
        }
    }

    [Fact]
    public void ACrossingIsNeverTimedBeforeTheSampleItIsSearchedFrom()
    {
        // Searching from the sample at 2.25 s (10 m/s) for 9.5 m/s, passed between 2.125 and
        // 2.25 s: already past at the first sample considered, so that sample's time, with σ of
        // the speed over the slope there (σ_v / a).
        Trajectory t = Launch(endS: 5, speedSigma: 0.02);
        int from = FigureCalculator.FirstIndexAtOrAfter(t.TimeS, 2.25);
        Estimate at = FigureCalculator.SpeedCrossing(t, from, 9.5)!.Value;
        Assert.Equal(2.25, at.Value);
        Assert.Equal(0.02 / A, at.Sigma, 12);
        Assert.Null(FigureCalculator.SpeedCrossing(t, from, 9.5, endS: 2.2));
        Assert.Equal(2.25, FigureCalculator.SpeedCrossing(t, from, 9.5, endS: 2.25)!.Value.Value);
    }

    [Fact]
    public void TheFirstSampleAtOrAfterATimeIsFoundAndTheLastServesBeyondTheEnd()
    {
        double[] times = [0, 1, 2];
        Assert.Equal(1, FigureCalculator.FirstIndexAtOrAfter(times, 0.5));
        Assert.Equal(1, FigureCalculator.FirstIndexAtOrAfter(times, 1));
        Assert.Equal(2, FigureCalculator.FirstIndexAtOrAfter(times, 9));
        Assert.Equal(0, FigureCalculator.FirstIndexAtOrAfter([], 9));
    }

    [Fact]
    public void PeakAccelerationTopSpeedAndDistanceComeFromTheTrajectory()
    {
        // From rest at 1 s to 5 s at 8 m/s²: top speed 32 m/s, distance 8·4²/2 = 64 m.
        FigureSet f = FigureCalculator.Compute(Launch(endS: 5), new Estimate(T0, 0));
        Assert.Equal(A, f.PeakAccelMps2);
        Assert.Equal(32, f.MaxSpeedMps, 12);
        Assert.Equal(64, f.DistanceM, 12);
    }

    [Fact]
    public void OnlyTheRequestedFiguresAreTimed()
    {
        FigureRequest request = Request(SpeedInterval.Kmh(0, 100));
        FigureSet f = FigureCalculator.Compute(Launch(endS: 5), new Estimate(T0, 0), request: request);
        IntervalFigure only = Assert.Single(f.SpeedIntervals);
        Assert.Equal("0-100 km/h", only.Interval.Label);
        Assert.Equal(100 / 3.6 / A, only.FromStandstillS!.Value, 9);
        Assert.Empty(f.DistanceMarks);
    }

    [Fact]
    public void ATrajectoryThatOpensMovingHasNoStandingFiguresAndTimesRollingIntervalsFromRealCrossings()
    {
        // Rolling at 10 m/s at 1 s, then 8 m/s² (v = 10 + 8·τ): 20-30 m/s takes 10/8 = 1.25 s.
        Trajectory t = Launch(endS: 5, startSpeed: 10);
        var rolling = new SpeedInterval("20-30", 20, 30);
        var alreadyPassed = new SpeedInterval("5-30", 5, 30);
        var atStartSpeed = new SpeedInterval("10-30", 10, 30);
        FigureRequest request = Request(SpeedInterval.Mph(0, 60), rolling, alreadyPassed, atStartSpeed) with { DistanceMarks = [DistanceMark.Feet("60 ft", 60)] };
        FigureSet f = FigureCalculator.Compute(t, new Estimate(T0, 0), request: request, standingStart: false);

        Assert.Null(f.RolloutTimeS);
        Assert.Null(f.RolloutSpeedMps);
        Assert.Null(f.SpeedIntervals[0].FromStandstillS);
        Assert.Null(f.MeanAccel0To60Mps2);
        Assert.Equal(1.25, f.SpeedIntervals[1].FromStandstillS!.Value, 12);
        Assert.Null(f.SpeedIntervals[2].FromStandstillS);
        Assert.Null(f.SpeedIntervals[3].FromStandstillS); // opening at 10 m/s is no crossing of 10 m/s
        Assert.Null(f.DistanceMarks[0].FromStandstillS);
    }

    [Fact]
    public void ACarAlreadyAtSixtyAtFirstMotionHasNoMeanAcceleration()
    {
        Trajectory t = Launch(endS: 5, startSpeed: 30);
        FigureSet f = FigureCalculator.Compute(t, new Estimate(T0, 0));
        Assert.Equal(0, f.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS);
        Assert.Null(f.MeanAccel0To60Mps2);
    }

    [Fact]
    public void SpeedUncertaintyCarriesIntoTheRolloutSpeedAndTheTrapSpeed()
    {
        // A trap's σ is the mean of the speed σ at its ends: with σ_v = 0.02 m/s throughout, 0.02.
        // 60 ft = 18.288 m with a 6-ft trap from 16.4592 m: trap speed 1.8288 m / Δt (common
        // practice: mean speed over the trap), Δt from d = 8·τ²/2.
        Trajectory t = ClosedFormTrajectory.ConstantAcceleration(A, T0, endS: 5, stepS: 0.001, sigmaSpeedMps: 0.02);
        FigureRequest request = Request() with { DistanceMarks = [DistanceMark.Feet("60 ft", 60, 6)] };
        FigureSet f = FigureCalculator.Compute(t, new Estimate(T0, 0), request: request);
        Assert.Equal(0.02, f.RolloutSpeedMps!.Value.Sigma, 12);
        MarkFigure mark = f.DistanceMarks[0];
        Assert.Equal(0.02, mark.TrapSpeedUncertaintyMps!.Value, 12);
        double dt = Math.Sqrt(2 * 18.288 / A) - Math.Sqrt(2 * 16.4592 / A);
        Assert.Equal(1.8288 / dt, mark.TrapSpeedMps!.Value, 4); // linear between 1-ms samples
    }

    [Fact]
    public void ACrossingsSigmaUsesTheSlopeInterpolatedAtTheCrossing()
    {
        // Constant power p = 200 W/kg from rest at 1 s: a = √(p/(2τ)) (any mechanics textbook);
        // 20.5 m/s is crossed at τ = v²/(2p), where a = √(p/(2τ)). With σ_v = 0.01·v, σ_t = σ_v / a.
        // Sampled every 0.1 s, σ_v and the slope are interpolated linearly.
        Trajectory power = ClosedFormTrajectory.ConstantPower(200, T0, endS: 4, stepS: 0.1);
        var withSigma = new Trajectory { TimeS = power.TimeS, DistanceM = power.DistanceM, SpeedMps = power.SpeedMps, AccelMps2 = power.AccelMps2, SpeedSigmaMps = [.. power.SpeedMps.Select(v => 0.01 * v)] };
        Estimate at = FigureCalculator.SpeedCrossing(withSigma, 0, 20.5)!.Value;
        double tau = 20.5 * 20.5 / 400;
        // Linear interpolation of a ∝ τ^(−1/2) costs 0.06 % here; a wrong interpolation of σ or slope, ~5 %.
        Assert.InRange(at.Sigma / (0.01 * 20.5 / Math.Sqrt(200 / (2 * tau))), 0.998, 1.002);
    }

    [Theory]
    [InlineData(2)]
    [InlineData(3)]
    public void ACrossingJustBelowAGearChangeIsCoveredWhicheverSideOfTheChangeAScaleErrorPutsIt(int k)
    {
        // The truth (kinematics, any textbook: piecewise constant acceleration): 3 m/s² from rest
        // at 1 s to 31.5 m/s, a change of 0.25 s at −0.4 m/s² (drive cut), then 2.3 m/s². A speed
        // read (1 + ε) times the truth, σ 1 % of it: 31.29 m/s (70 mph) lies 0.67 % below the
        // change's top, so ε under about −0.67 % puts the read crossing after the change. Every
        // ε within ±k σ must leave the true crossing within ±k σ of the read one.
        const double Target = 31.2928;
        const double Top = 31.5;
        const double Change = 0.25;
        double tTop = T0 + (Top / 3);
        double trueCrossing = T0 + (Target / 3);
        var worst = new List<string>();
        for (double eps = -0.0095 * k; eps <= 0.0095 * k; eps += 0.0005)
        {
            Trajectory read = GearChange(tTop, Top, Change, 1 + eps);
            Estimate at = FigureCalculator.SpeedCrossing(read, 0, Target)!.Value;
            double error = at.Value - trueCrossing;
            string what = FormattableString.Invariant($"ε {eps:+0.0000;-0.0000}: error {error:+0.000;-0.000} s, σ {at.Sigma:0.000} s");
            worst.Add(what);
            Assert.True(Math.Abs(error) <= k * at.Sigma, what + "\n" + string.Join("\n", worst));
        }

        // A speed that rises all through ±3σ is timed with the slope's σ alone (σ_v / a).
        Trajectory early = GearChange(tTop, Top, Change, 1);
        Estimate at20 = FigureCalculator.SpeedCrossing(early, 0, 20)!.Value;
        Assert.Equal(0.01 * 20 / 3, at20.Sigma, 6);
    }

    [Fact]
    public void TheTopSpeedsUncertaintyKeepsASlowFadeCountingAsTheTop()
    {
        // To 30 m/s at 8 m/s², then slowing at 0.2 m/s² for 5 s (1 m/s lost). With σ_v = 1 m/s
        // the top holds while the speed is within 0.1 m/s + 3σ of it, so the whole fade counts
        // and a mark passed during it is timed; without the σ it would not be.
        const double Fade = 0.2;
        double top = T0 + (30 / A);
        var time = new List<double>();
        var dist = new List<double>();
        var speed = new List<double>();
        var accel = new List<double>();
        for (double s = 0; s <= top + 5; s += Step)
        {
            double tau = Math.Max(0, Math.Min(s, top) - T0);
            double fade = Math.Max(0, s - top);
            time.Add(s);
            speed.Add((A * tau) - (Fade * fade));
            dist.Add((A * tau * tau / 2) + (30 * fade) - (Fade * fade * fade / 2));
            accel.Add(s < T0 ? 0 : s < top ? A : -Fade);
        }

        var t = new Trajectory { TimeS = [.. time], DistanceM = [.. dist], SpeedMps = [.. speed], AccelMps2 = [.. accel], SpeedSigmaMps = [.. time.Select(_ => 1.0)] };
        double markM = (30 * 30 / (2 * A)) + 60; // 60 m into the fade: 30·s − 0.1·s² = 60 → s ≈ 2.0134 s
        FigureRequest request = Request() with { DistanceMarks = [DistanceMark.Metres(markM)] };
        MarkFigure mark = FigureCalculator.Compute(t, new Estimate(T0, 0), request: request).DistanceMarks[0];
        double s60 = (30 - Math.Sqrt((30 * 30) - (4 * 0.1 * 60))) / (2 * 0.1);
        Assert.Equal(top - T0 + s60, mark.FromStandstillS!.Value, 3);
    }

    [Fact]
    public void MalformedOrMissingTrajectoriesAreCallerErrorsAndAnEmptyOneHasNoFigures()
    {
        Assert.Throws<ArgumentNullException>(() => FigureCalculator.Compute(null!, new Estimate(0, 0)));
        Assert.Throws<ArgumentNullException>(() => FigureCalculator.AccelerationEnd(null!, 0));
        var shortSpeed = new Trajectory { TimeS = [0, 1], DistanceM = [0, 1], SpeedMps = [0], AccelMps2 = [0, 0] };
        Assert.Throws<ArgumentException>(() => FigureCalculator.Compute(shortSpeed, new Estimate(0, 0)));
        var empty = new Trajectory { TimeS = [], DistanceM = [], SpeedMps = [], AccelMps2 = [] };
        FigureSet none = FigureCalculator.Compute(empty, new Estimate(0, 0));
        Assert.Equal(0, none.DistanceM);
        Assert.Null(none.RolloutTimeS);
    }

    [Fact]
    public void MarksInFeetAndMetres()
    {
        // 1 ft = 0.3048 m exactly (international yard and pound, 1959): 1320 ft = 402.336 m, 66 ft = 20.1168 m.
        DistanceMark quarter = DistanceMark.Feet("1320 ft", 1320, 66);
        Assert.Equal(402.336, quarter.DistanceM, 9);
        Assert.Equal(20.1168, quarter.TrapLengthM!.Value, 9);
        Assert.Null(DistanceMark.Feet("60 ft", 60).TrapLengthM);
        Assert.Equal("100 m", DistanceMark.Metres(100).Label);
    }

    [Theory]
    [InlineData("50mph", 22.352)] // 1 mph = 0.44704 m/s exactly (1959)
    [InlineData("80 km/h", 80 / 3.6)]
    [InlineData("80kmh", 80 / 3.6)]
    [InlineData("80 KPH", 80 / 3.6)]
    [InlineData("1080 km/h", 300)]
    public void SpeedsParseWithTheirUnit(string text, double mps)
    {
        Assert.Equal(mps, SpeedInterval.ParseSpeedMps(text), 9);
    }

    [Theory]
    [InlineData("0mph", "is not a positive number with a unit (e.g. 50mph)")]
    [InlineData("-5mph", "is not a positive number")]
    [InlineData("fast mph", "is not a positive number")]
    [InlineData("50", "speed '50' needs a unit: mph or km/h (e.g. 50mph)")]
    [InlineData("1081 km/h", "is above 300 m/s, faster than any car")]
    public void BadSpeedsAreRefusedWithAReason(string text, string reason)
    {
        Assert.Contains(reason, Assert.Throws<FormatException>(() => SpeedInterval.ParseSpeedMps(text)).Message);
    }

    [Theory]
    [InlineData("0-100kph", 100 / 3.6)]
    [InlineData("0-100kmh", 100 / 3.6)]
    [InlineData("0-1080 km/h", 300)]
    public void IntervalsTakeEveryMetricSpellingUpTo300MetresASecond(string text, double toMps)
    {
        Assert.Equal(toMps, SpeedInterval.Parse(text).ToMps, 9);
    }

    [Theory]
    [InlineData("40-80", "interval '40-80' needs a unit: mph or km/h (e.g. 40-80mph)")]
    [InlineData("50-50mph", "must rise from a speed ≥ 0 to a higher one")]
    [InlineData("0-1081 km/h", "goes above 300 m/s")]
    public void BadIntervalsSayWhy(string text, string reason)
    {
        Assert.Contains(reason, Assert.Throws<FormatException>(() => SpeedInterval.Parse(text)).Message);
    }

    private static FigureRequest Request(params SpeedInterval[] intervals) => new() { SpeedIntervals = intervals, DistanceMarks = [] };

    /// <summary>From rest at <see cref="T0"/>: 3 m/s² to <paramref name="top"/> (at
    /// <paramref name="tTop"/>), −0.4 m/s² for <paramref name="change"/>, then 2.3 m/s² to 16 s;
    /// every speed and acceleration times <paramref name="scale"/>, speed σ 1 % of the speed;
    /// sampled every millisecond.</summary>
    private static Trajectory GearChange(double tTop, double top, double change, double scale)
    {
        const double Dt = 0.001;
        int n = (int)(16 / Dt) + 1;
        double[] t = new double[n], d = new double[n], v = new double[n], a = new double[n];
        double vEnd = top - (0.4 * change);
        for (int i = 0; i < n; i++)
        {
            t[i] = i * Dt;
            double s = t[i];
            (double speed, double accel) = s < T0 ? (0, 0)
                : s < tTop ? (3 * (s - T0), 3)
                : s < tTop + change ? (top - (0.4 * (s - tTop)), -0.4)
                : (vEnd + (2.3 * (s - tTop - change)), 2.3);
            v[i] = scale * speed;
            a[i] = scale * accel;
            d[i] = i == 0 ? 0 : d[i - 1] + (0.5 * (v[i] + v[i - 1]) * Dt);
        }

        return new Trajectory { TimeS = t, DistanceM = d, SpeedMps = v, AccelMps2 = a, SpeedSigmaMps = [.. v.Select(x => 0.01 * x)] };
    }

    /// <summary>At <paramref name="startSpeed"/> until <see cref="T0"/>, then <see cref="A"/>,
    /// sampled every <see cref="Step"/> (binary-exact) to <paramref name="endS"/>.</summary>
    private static Trajectory Launch(double endS, double speedSigma = 0, double startSpeed = 0)
    {
        int n = (int)(endS / Step) + 1;
        double[] t = new double[n], d = new double[n], v = new double[n], a = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i * Step;
            double tau = Math.Max(0, t[i] - T0);
            v[i] = startSpeed + (A * tau);
            d[i] = (startSpeed * tau) + (A * tau * tau / 2);
            a[i] = t[i] >= T0 ? A : 0;
        }

        return new Trajectory { TimeS = t, DistanceM = d, SpeedMps = v, AccelMps2 = a, SpeedSigmaMps = speedSigma > 0 ? [.. t.Select(_ => speedSigma)] : null };
    }
}
