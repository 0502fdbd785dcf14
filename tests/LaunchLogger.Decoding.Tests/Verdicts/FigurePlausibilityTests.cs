using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Tests.Verdicts;

/// <summary>A figure no car can produce makes the run invalid, wherever it sits in the results.
/// The limits: 300 m/s (InputLimits) and 200 m/s², about 20 g (top-fuel dragsters reach about
/// 5 g, common practice).</summary>
public class FigurePlausibilityTests
{
    private const double G = 9.80665; // standard gravity (CGPM 1901, exact)

    [Fact]
    public void ACleanRunWithAStopAndAGradeIsPlausibleAndItsVerdictUntouched()
    {
        RunAnalysis run = Full();
        Assert.Null(FigurePlausibility.Check(run));
        var verdict = new Verdict([]);
        Assert.Same(verdict, FigurePlausibility.Apply(verdict, run));
    }

    [Theory]
    [InlineData(300.0, false)]
    [InlineData(300.5, true)]
    [InlineData(-300.5, true)]
    public void ASpeedAbove300MetresASecondIsImpossible(double speed, bool impossible)
    {
        RunAnalysis run = Full();
        RunAnalysis changed = run with { Figures = run.Figures with { MaxSpeedMps = speed } };
        VerdictReason? reason = FigurePlausibility.Check(changed);
        Assert.Equal(impossible, reason is not null);
        if (impossible)
        {
            Assert.Contains("figures.MaxSpeedMps is", reason!.Text);
            Assert.Contains("m/s, above 300 m/s", reason.Text);
        }
    }

    [Theory]
    [InlineData(200.0, false)]
    [InlineData(201.0, true)]
    [InlineData(-201.0, true)]
    public void AnAccelerationAbove200MetresASecondSquaredIsImpossible(double accel, bool impossible)
    {
        RunAnalysis run = Full();
        RunAnalysis changed = run with { Braking = run.Braking! with { PeakDecelMps2 = accel } };
        VerdictReason? reason = FigurePlausibility.Check(changed);
        Assert.Equal(impossible, reason is not null);
        if (impossible)
        {
            Assert.Contains("braking.PeakDecelMps2 is", reason!.Text);
            Assert.Contains("m/s², above 200 m/s²", reason.Text);
        }

        // A distance or a time is no speed or acceleration: large is not impossible.
        Assert.Null(FigurePlausibility.Check(run with { Figures = run.Figures with { DistanceM = 5000 } }));
    }

    [Fact]
    public void AnUndefinedNumberIsFoundInListsEstimatesAndEveryPart()
    {
        RunAnalysis run = Full();
        IntervalFigure[] intervals = [.. run.Figures.SpeedIntervals];
        intervals[1] = intervals[1] with { FromStandstillS = double.PositiveInfinity };
        Assert.Contains("the " + intervals[1].Interval.Label + " from standstill could not be computed", Text(run with { Figures = run.Figures with { SpeedIntervals = intervals } }));

        Assert.Contains("the stop's stopping distance uncertainty could not be computed", Text(run with { Braking = run.Braking! with { StoppingDistanceM = new Estimate(40, double.NaN) } }));
        Assert.Contains("the stop's stopping distance could not be computed", Text(run with { Braking = run.Braking! with { StoppingDistanceM = new Estimate(double.NaN, 0.1) } }));
        Assert.Contains("the grade's angle could not be computed", Text(run with { Grade = new GradeEstimate(double.NaN, 0.001, true) }));
        Assert.Contains("the level-road distance could not be computed", Text(run with { LevelFigures = run.Figures with { DistanceM = double.NaN } }));
        Assert.DoesNotContain("FirstMotionS", Text(run with { Figures = run.Figures with { FirstMotionS = new Estimate(double.NaN, double.NaN) } }), StringComparison.Ordinal);
        Assert.Contains("the first motion could not be computed", Text(run with { Figures = run.Figures with { FirstMotionS = new Estimate(double.NaN, double.NaN) } }));
        Assert.Contains("the standard-air distance could not be computed", Text(run with { StandardAirFigures = run.Figures with { DistanceM = double.NaN } }));
    }

    [Fact]
    public void TheReasonIsInvalidNamesTheFirstProblemAndCountsTheRest()
    {
        RunAnalysis run = Full();
        RunAnalysis twice = run with { Figures = run.Figures with { DistanceM = double.NaN, MaxSpeedMps = double.NaN } };
        Verdict verdict = FigurePlausibility.Apply(new Verdict([]), twice);
        VerdictReason reason = Assert.Single(verdict.Reasons);
        Assert.Equal(VerdictLevel.Invalid, verdict.Level);
        Assert.Equal("impossible_figure", reason.Code);
        Assert.StartsWith("a figure no car can produce: the ", reason.Text, StringComparison.Ordinal);
        Assert.Contains(" (and 1 more); the input is damaged or its settings are wrong", reason.Text);
        Assert.Equal("a figure no car can produce: the distance could not be computed; the input is damaged or its settings are wrong", FigurePlausibility.Check(run with { Figures = run.Figures with { DistanceM = double.NaN } })!.Text);
    }

    private static string Text(RunAnalysis run) => FigurePlausibility.Check(run)?.Text ?? "(plausible)";

    /// <summary>The clean judged launch with a firm stop, a grade and both corrected figure sets.</summary>
    private static RunAnalysis Full()
    {
        RunAnalysis run = JudgedRun.Clean(braking: JudgedRun.Stop(0.9 * G, mfdd: 0.9 * G, peak: 1.0 * G));
        return run with { Grade = new GradeEstimate(0.01, 0.001, true), LevelFigures = run.Figures, StandardAirFigures = run.Figures };
    }
}
