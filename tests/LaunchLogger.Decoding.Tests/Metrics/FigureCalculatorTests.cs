using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using UnitsNet;

namespace LaunchLogger.Decoding.Tests.Metrics;

public class FigureCalculatorTests
{
    private const double HalfG = 0.5 * 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)

    [Fact]
    public void HalfGLaunchMatchesTheReferenceFigures()
    {
        // REFERENCES.md, kinematics: at a constant 0.5 g from rest, 1 ft takes 0.35260 s;
        // 0–60 mph takes 5.4702 s from standstill and 5.1177 s once the first foot is subtracted.
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(HalfG, t0: 1.0, endS: 40);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(1.0, 0));

        Assert.Equal(1.0 + 0.35260, figures.RolloutTimeS!.Value.Value, 4);
        IntervalFigure zeroTo60 = figures.SpeedIntervals.Single(f => f.Interval.Label == "0-60 mph");
        Assert.Equal(5.4702, zeroTo60.FromStandstillS!.Value, 4);
        Assert.Equal(5.1177, zeroTo60.FromRolloutS!.Value, 4);
        Assert.Equal(26.8224 / 5.4702, figures.MeanAccel0To60Mps2!.Value, 3);
    }

    [Fact]
    public void SpeedTargetsAgreeWithUnitsNet()
    {
        // Oracle: UnitsNet conversions of mph and km/h to m/s.
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(HalfG, t0: 0.5, endS: 40);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(0.5, 0));
        double v100 = Speed.FromKilometersPerHour(100).MetersPerSecond;
        double v30 = Speed.FromMilesPerHour(30).MetersPerSecond;
        Assert.Equal(v100 / HalfG, figures.SpeedIntervals.Single(f => f.Interval.Label == "0-100 km/h").FromStandstillS!.Value, 4);
        Assert.Equal(v30 / HalfG, figures.SpeedIntervals.Single(f => f.Interval.Label == "0-30 mph").FromStandstillS!.Value, 4);
    }

    [Fact]
    public void DistanceMarksAndTrapSpeedFollowClosedForm()
    {
        // Kinematics (any textbook): t(d) = sqrt(2d/a). Trap: 66 ft before the mark, common practice.
        const double a = 6.0;
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(a, t0: 2.0, endS: 30);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(2.0, 0));
        double d60 = Length.FromFeet(60).Meters;
        double d1320 = Length.FromFeet(1320).Meters;
        double d1254 = Length.FromFeet(1254).Meters;
        double rolloutAfter = Math.Sqrt(2 * 0.3048 / a);

        MarkFigure sixty = figures.DistanceMarks.Single(m => m.Mark.Label == "60 ft");
        Assert.Equal(Math.Sqrt(2 * d60 / a), sixty.FromStandstillS!.Value, 4);
        Assert.Equal(Math.Sqrt(2 * d60 / a) - rolloutAfter, sixty.FromRolloutS!.Value, 4);
        Assert.Null(sixty.TrapSpeedMps);

        MarkFigure quarter = figures.DistanceMarks.Single(m => m.Mark.Label.StartsWith("1320 ft", StringComparison.Ordinal));
        double expectedTrap = (d1320 - d1254) / (Math.Sqrt(2 * d1320 / a) - Math.Sqrt(2 * d1254 / a));
        Assert.Equal(expectedTrap, quarter.TrapSpeedMps!.Value, 3);
        Assert.Equal(a * Math.Sqrt(2 * d1320 / a), quarter.SpeedAtMarkMps!.Value, 2);
    }

    [Fact]
    public void TrapOf66FeetGivesFortyFiveOverDeltaT()
    {
        // Common practice: over a 66-ft trap, mph = 45 / Δt (66 ft/s = 45 mph).
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(6.0, t0: 0, endS: 30);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(0, 0));
        MarkFigure eighth = figures.DistanceMarks.Single(m => m.Mark.Label.StartsWith("660 ft", StringComparison.Ordinal));
        double dt = Math.Sqrt(2 * Length.FromFeet(660).Meters / 6.0) - Math.Sqrt(2 * Length.FromFeet(594).Meters / 6.0);
        Assert.Equal(45 / dt, Speed.FromMetersPerSecond(eighth.TrapSpeedMps!.Value).MilesPerHour, 3);
    }

    [Fact]
    public void RollingAndPassingIntervalsAreTheSameUnderBothConventions()
    {
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(HalfG, t0: 1.0, endS: 40);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(1.0, 0));
        IntervalFigure passing = figures.SpeedIntervals.Single(f => f.Interval.Label == "30-50 mph");
        Assert.Equal(20 * 0.44704 / HalfG, passing.FromStandstillS!.Value, 4);
        Assert.Equal(passing.FromStandstillS, passing.FromRolloutS);
    }

    [Fact]
    public void UnreachedTargetsAreNull()
    {
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(HalfG, t0: 1.0, endS: 6.0);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(1.0, 0));
        IntervalFigure zeroTo200 = figures.SpeedIntervals.Single(f => f.Interval.Label == "0-200 km/h");
        Assert.Null(zeroTo200.FromStandstillS);
        Assert.Null(zeroTo200.FromRolloutS);
        Assert.Null(figures.DistanceMarks.Single(m => m.Mark.Label == "400 m").FromStandstillS);
    }

    [Fact]
    public void UncertaintyOfACrossingIsSigmaOverSlopeCombinedWithTheStart()
    {
        // σ_t = σ_v / a at a speed crossing, combined root-sum-square with the start's σ.
        var trajectory = ClosedFormTrajectory.ConstantAcceleration(5.0, t0: 1.0, endS: 20, sigmaDistanceM: 0.02, sigmaSpeedMps: 0.05);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(1.0, 0.003));
        IntervalFigure zeroTo60 = figures.SpeedIntervals.Single(f => f.Interval.Label == "0-60 mph");
        Assert.Equal(Math.Sqrt(Math.Pow(0.05 / 5.0, 2) + Math.Pow(0.003, 2)), zeroTo60.UncertaintyS!.Value, 6);
    }

    [Theory]
    [InlineData("40-80mph", 40 * 0.44704, 80 * 0.44704, "40-80 mph")]
    [InlineData("0-150 km/h", 0, 150 / 3.6, "0-150 km/h")]
    [InlineData("80-120kmh", 80 / 3.6, 120 / 3.6, "80-120 km/h")]
    public void IntervalsParse(string text, double fromMps, double toMps, string label)
    {
        SpeedInterval interval = SpeedInterval.Parse(text);
        Assert.Equal(fromMps, interval.FromMps, 9);
        Assert.Equal(toMps, interval.ToMps, 9);
        Assert.Equal(label, interval.Label);
    }

    [Theory]
    [InlineData("40-80", "needs a unit")]
    [InlineData("fast-80mph", "not FROM-TO")]
    [InlineData("80-40mph", "must rise")]
    public void BadIntervalsAreRejectedWithAReason(string text, string reason)
    {
        var error = Assert.Throws<FormatException>(() => SpeedInterval.Parse(text));
        Assert.Contains(reason, error.Message);
    }

    [Fact]
    public void NoMarkIsTimedWhileCoastingOrBraking()
    {
        // 4 m/s² from rest for 10 s (40 m/s, 200 m: kinematics), then 0.5 s of coasting at
        // 0.4 m/s², then 8 m/s² of braking. 60 ft (18.3 m) and 100 m are reached under power; 660 ft
        // (201.2 m) is reached 0.03 s into the coast, 1000 ft (304.8 m) only under the brakes.
        Trajectory trajectory = LaunchCoastBrake(out double coastS, out double brakeS);
        FigureSet figures = FigureCalculator.Compute(trajectory, new Estimate(0, 0));

        Assert.Equal(Math.Sqrt(2 * 18.288 / 4), Mark(figures, "60 ft").FromStandstillS!.Value, 3);
        Assert.Equal(Math.Sqrt(2 * 100 / 4.0), Mark(figures, "100 m").FromStandstillS!.Value, 3);
        Assert.Equal(10 + (1.168 / 40), Mark(figures, "660 ft (1/8 mile)").FromStandstillS!.Value, 3);
        Assert.Null(Mark(figures, "1000 ft").FromStandstillS);
        Assert.Null(Mark(figures, "1000 ft").SpeedAtMarkMps);
        Assert.Null(Mark(figures, "400 m").FromStandstillS);
        Assert.Equal(40, figures.MaxSpeedMps, 6);

        // Told of a brake onset before the top speed, the figures stop there.
        FigureSet braked = FigureCalculator.Compute(trajectory, new Estimate(0, 0), brakeOnsetS: 6.0);
        Assert.Null(Mark(braked, "100 m").FromStandstillS); // 100 m at 7.07 s
        Assert.Equal(Math.Sqrt(2 * 18.288 / 4), Mark(braked, "60 ft").FromStandstillS!.Value, 3);
        Assert.Null(braked.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS); // 60 mph at 6.71 s
        Assert.Equal(6.0, FigureCalculator.AccelerationEnd(trajectory, 0, 6.0));
        Assert.True(coastS < brakeS);
    }

    [Fact]
    public void AccelerationEndsWhereTheSpeedLeavesItsTop()
    {
        Trajectory trajectory = LaunchCoastBrake(out double coastS, out _);

        // The coast loses 0.4 m/s² · t: the 0.1 m/s tolerance is used up 0.25 s into it.
        Assert.Equal(coastS + (FigureCalculator.TopSpeedToleranceMps / 0.4), FigureCalculator.AccelerationEnd(trajectory, 0), 2);

        // A later onset changes nothing; a run that ends at its top speed never ends its acceleration.
        Assert.Equal(FigureCalculator.AccelerationEnd(trajectory, 0), FigureCalculator.AccelerationEnd(trajectory, 0, 50.0));
        Assert.Equal(double.PositiveInfinity, FigureCalculator.AccelerationEnd(ClosedFormTrajectory.ConstantAcceleration(4, 0, 10), 0));

        // Holding the top speed is not coasting: a cruise keeps the acceleration phase open.
        Trajectory cruise = ClosedFormTrajectory.ConstantAcceleration(4, 0, 10);
        double[] v = cruise.SpeedMps;
        int top = Array.IndexOf(cruise.TimeS, cruise.TimeS.First(t => t >= 5));
        for (int i = top; i < v.Length; i++)
        {
            v[i] = v[top] - (0.05 * ((i - top) % 2)); // within the tolerance of the top speed
        }

        Assert.Equal(double.PositiveInfinity, FigureCalculator.AccelerationEnd(cruise, 0));
    }

    private static MarkFigure Mark(FigureSet figures, string label) => figures.DistanceMarks.Single(m => m.Mark.Label == label);

    private static Trajectory LaunchCoastBrake(out double coastS, out double brakeS)
    {
        const double step = 0.001;
        coastS = 10.0;
        brakeS = 10.5;
        var t = new List<double>();
        var d = new List<double>();
        var v = new List<double>();
        var a = new List<double>();
        double time = 0, dist = 0, speed = 0;
        while (speed >= 0)
        {
            double acc = time < coastS ? 4 : time < brakeS ? -0.4 : -8;
            t.Add(time);
            d.Add(dist);
            v.Add(speed);
            a.Add(acc);
            dist += (speed * step) + (0.5 * acc * step * step);
            speed += acc * step;
            time = Math.Round((time + step) * 1000) / 1000;
        }

        return new Trajectory { TimeS = [.. t], DistanceM = [.. d], SpeedMps = [.. v], AccelMps2 = [.. a] };
    }
}
