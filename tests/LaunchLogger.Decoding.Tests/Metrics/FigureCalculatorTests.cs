using LaunchLogger.Decoding.Metrics;
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
}
