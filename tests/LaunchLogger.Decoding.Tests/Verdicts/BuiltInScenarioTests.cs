using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Verdicts;

/// <summary>Every built-in scenario end to end: the simulator drives the firmware core, the log is
/// decoded and judged, and the figures are bounded against the simulator's truth.</summary>
/// <remarks>The simulator shares the estimator's view of a car, so these bound the whole chain
/// (firmware, log, reader, reconstruction, figures, judge) rather than stand as outside checks.</remarks>
public class BuiltInScenarioTests
{
    public static TheoryData<string> Names => new(BuiltInScenarios.Names);

    [Theory]
    [MemberData(nameof(Names))]
    public void EveryBuiltInScenarioIsACleanRunJudgedValidWithFiguresNearTheTruth(string name)
    {
        // Every built-in scenario is a clean run: each shows a side of the box (a coarse pickup, a
        // spinning driven wheel with an undriven second channel, ABS) that it must cope with.
        SimulationResult simulation = Simulator.Run(BuiltInScenarios.Get(name), seed: 1);
        RunAnalysis run = SessionAnalyzer.Analyze(LogReader.Read(simulation.LogBytes, name + ".log").Runs).Runs.Single();

        Assert.True(run.Verdict!.Level == VerdictLevel.Valid, $"{name}: {string.Join("; ", run.Verdict.Reasons.Select(r => r.Code + ": " + r.Text))}");

        // First motion and the rollout mark within 3 of their stated σ of the truth.
        Estimate firstMotion = run.Figures.FirstMotionS;
        Estimate rollout = run.Figures.RolloutTimeS!.Value;
        AssertWithinSigma(firstMotion.Value - simulation.Events.FirstMotionS!.Value, firstMotion.Sigma, 3, name + " first motion");
        AssertWithinSigma(rollout.Value - simulation.Events.RolloutS!.Value, rollout.Sigma, 3, name + " rollout");

        // 0-60 mph under both conventions: within 3σ plus what the tyre's growth with speed
        // explains (the box counts turns of a static circumference, so each time is late by at
        // most the growth at that speed, a fraction of itself).
        double growth = simulation.Scenario.Tyre.RadiusGrowthAt30Mps;
        IntervalFigure ours = ZeroTo60(run.Figures);
        IntervalFigure truth = ZeroTo60(simulation.Figures!);
        double standing = ours.FromStandstillS!.Value;
        AssertWithinSigma(standing - truth.FromStandstillS!.Value, ours.UncertaintyS!.Value + (growth * standing / 3), 3, name + " 0-60 mph");
        double afterRollout = ours.FromRolloutS!.Value;
        AssertWithinSigma(afterRollout - truth.FromRolloutS!.Value, ours.FromRolloutUncertaintyS!.Value + (growth * afterRollout / 3), 3, name + " 0-60 mph after rollout");

        // Every acceleration figure reported exists in the truth too, and none is timed after the
        // brakes came on.
        double onset = run.Braking!.OnsetS.Value;
        foreach (MarkFigure mark in run.Figures.DistanceMarks.Where(m => m.FromStandstillS is not null))
        {
            Assert.True(firstMotion.Value + mark.FromStandstillS!.Value <= onset, $"{name}: {mark.Mark.Label} timed after brake onset");
        }
    }

    [Fact]
    public void AnAbsStopSlidesInTheBrakingWindowsNotInTheWheelspinOnesAndSetsTheBound()
    {
        // brake-test-60: a full ABS stop. The wheel slides under the brakes: that is carried by
        // the accelerometer, is no wheelspin, and shows the stop was at the grip limit.
        SimulationResult simulation = Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed: 1);
        Assert.True(simulation.Events.AbsCycles > 0, "the scenario's ABS must cycle");
        SessionAnalysis session = SessionAnalyzer.Analyze(LogReader.Read(simulation.LogBytes, "brake.log").Runs);
        RunAnalysis run = session.Runs.Single();

        Assert.NotEmpty(run.Reconstruction.BrakingSlideWindows);
        // Each slide window lies in the stop (at least 90 % of it: its edges are found on a
        // smoothed signal, measured 84 ms early at the onset on a 3.1 s window).
        double onset = simulation.Events.BrakeOnsetS!.Value;
        double standstill = simulation.Events.StandstillS!.Value;
        Assert.All(run.Reconstruction.BrakingSlideWindows, w =>
            Assert.True(Math.Min(w.EndS, standstill) - Math.Max(w.StartS, onset) >= 0.9 * w.LengthS, $"slide {w.StartS:F3}-{w.EndS:F3} s against the stop {onset:F3}-{standstill:F3} s"));
        Assert.Empty(run.Reconstruction.WheelspinWindows);
        Assert.DoesNotContain(run.Verdict!.Reasons, r => r.Code == "wheelspin");
        Assert.Equal(VerdictLevel.Valid, run.Verdict.Level);
        Assert.Equal(GripLimit.WheelSlide, session.Bound!.Basis);
    }

    [Theory]
    [InlineData("roadster-launch")]
    [InlineData("electric-saloon")]
    public void AGentleStopIsReportedButBoundsNothing(string name)
    {
        // These stops ask for 0.5-0.6 g, short of the tyres' grip (over 1 g): nothing bounds the
        // launch, and the run stays valid (it was once doubtful for "beating" its own gentle stop).
        SimulationResult simulation = Simulator.Run(BuiltInScenarios.Get(name), seed: 1);
        Assert.Equal(0, simulation.Events.AbsCycles);
        SessionAnalysis session = SessionAnalyzer.Analyze(LogReader.Read(simulation.LogBytes, name + ".log").Runs);
        Assert.NotNull(session.Runs.Single().Braking);
        Assert.Null(session.Bound);
        Assert.Null(GripLimit.Assess(session.Runs.Single(), namedByUser: false));
    }

    private static IntervalFigure ZeroTo60(FigureSet figures) => figures.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph");

    private static void AssertWithinSigma(double error, double sigma, double k, string what) =>
        Assert.True(Math.Abs(error) <= k * sigma, $"{what}: error {error * 1000:F2} ms against {k}σ = {k * sigma * 1000:F2} ms");
}
