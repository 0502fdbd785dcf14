using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Simulation;

namespace LaunchLogger.Cli.Bench;

/// <summary>Runs simulated launches through the firmware core and the decoder, and compares our
/// estimator and the naive method (first pulse = start, speed from pulses counted over 0.1 s)
/// with the simulator's truth.</summary>
public static class AccuracyBenchmark
{
    /// <summary>Simulates and decodes one case.</summary>
    public static IReadOnlyList<CaseOutcome> Run(AccuracyCase c, CancellationToken cancel)
    {
        cancel.ThrowIfCancellationRequested();
        SimulationResult simulation;
        try
        {
            simulation = Simulator.Run(c.Scenario, c.Seed, cancel);
        }
        catch (ArgumentException e)
        {
            return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, $"the scenario was refused: {e.Message}")];
        }

        if (simulation.Figures is not { } truth)
        {
            return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, "the simulation produced no truth figures")];
        }

        LogReadResult log = LogReader.Read(simulation.LogBytes, c.Scenario.Name);
        DecodedRun? run = log.Runs.OrderByDescending(r => r.Pulses.Count).FirstOrDefault();
        if (run is null)
        {
            return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, "the box logged no run")];
        }

        // Analysed and judged as `report` does a log's run (a log's run is never split again),
        // so the bench sees the verdict a user would.
        RunAnalysis ours;
        FigureSet naive;
        try
        {
            SessionAnalysis session = SessionAnalyzer.Analyze([run], AccelScaleDraw.Options(c.AccelCalibration, c.TyreCalibration, c.StaticTyreM, c.PickupWheelTold), cancel: cancel);
            if (session.Runs.Count != 1)
            {
                return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, session.Failures.FirstOrDefault() ?? $"the box's run was read as {session.Runs.Count} runs")];
            }

            ours = session.Runs[0];
            naive = NaiveFigures(run);
        }
        catch (Exception e) when (e is AnalysisException or InvalidOperationException)
        {
            return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, e.Message)];
        }

        // Truth figures are on the same clock as the log: the simulator writes its truth in the
        // box's time.
        FigureSet truthAligned = truth with { FirstMotionS = new Estimate(simulation.Events.FirstMotionS ?? truth.FirstMotionS.Value, 0) };
        FigureValues truthValues = FigureReading.FromFigures(truthAligned)
            .Set(BenchFigure.Grade, simulation.Events.GradePercent);
        if (simulation.Events is { BrakeOnsetS: { } onset, BrakeOnsetDistanceM: { } from, StandstillDistanceM: { } to })
        {
            truthValues.Set(BenchFigure.BrakeOnset, onset).Set(BenchFigure.StoppingDistance, to - from);
        }

        return [CaseOutcome.Compare(c.Index, c.Summary, c.Group, truthValues, FigureReading.FromFigures(ours.Figures, ours.Braking, ours.Grade, ours.Reconstruction.Staged), FigureReading.FromFigures(naive))
            with { AccelFirstFoot = AccelFirstFootError(ours.Reconstruction, simulation.Truth), Verdict = ours.Verdict, Expected = Expected(c, simulation.Events, truth, simulation.Truth.SpeedMps.Max(), TargetEdge.TopSpeedSigmaMps(ours)) }];
    }

    /// <summary>The verdict a simulated run deserves, from the simulation's truth. Every bench
    /// scenario is a standing start with working sensors (no dropped pulses, no lost frames), so
    /// it is clean, but for what the judge's rules say of two things the truth shows: the pickup's
    /// own wheel slipping past the tyre's friction peak (<see cref="Simulation.Scenarios.TyreSpec.PeakSlip"/>;
    /// past the peak of a Magic-Formula curve the tyre slides rather than grips — Pacejka, "Tire
    /// and Vehicle Dynamics", ch. 4, from memory) for longer than the judge's
    /// <see cref="VerdictLimits.WheelspinS"/> before the brakes come on is doubtful with
    /// <c>wheelspin</c>; a run whose truth never reached 60 mph is doubtful with
    /// <c>target_not_reached</c>. A spin on the first pickup weakens nothing when a second
    /// pickup turns with an undriven wheel (it carries the distance). A run whose true top speed
    /// <paramref name="truthTopMps"/> passed 60 mph by less than the data resolves (the decoder's
    /// σ of its top speed, <paramref name="topSpeedSigmaMps"/>; <see cref="TargetEdge"/>) may
    /// carry <c>target_not_reached</c> or not.</summary>
    public static ExpectedVerdict Expected(AccuracyCase c, Simulation.Truth.TruthEvents events, FigureSet truth, double truthTopMps = double.PositiveInfinity, double? topSpeedSigmaMps = null)
    {
        ArgumentNullException.ThrowIfNull(c);
        ArgumentNullException.ThrowIfNull(events);
        ArgumentNullException.ThrowIfNull(truth);
        ExpectedVerdict expected = ExpectedVerdict.Clean(c.DrivenPickup ? "standing start, driven pickup" : "standing start, undriven pickup");
        // A second pickup on an undriven wheel carries the distance when the first spins: then
        // the spin weakens nothing.
        bool undrivenSecond = c.Scenario.SecondPickup is { } second && c.Scenario.Vehicle.DrivenAxle != Simulation.Scenarios.DrivenAxle.All
            && (c.Scenario.Vehicle.DrivenAxle == Simulation.Scenarios.DrivenAxle.Front) != (second.Axle == Simulation.Scenarios.Axle.Front);
        if (events.PickupSpinS > VerdictLimits.Default.WheelspinS && !undrivenSecond)
        {
            expected = expected.And(VerdictLevel.Doubtful, ExpectedVerdict.WheelspinCode, FormattableString.Invariant($"the pickup wheel slipped past the tyre's peak for {events.PickupSpinS:0.00} s"));
        }

        if (truth.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == "0-60 mph")?.FromStandstillS is null)
        {
            expected = expected.And(VerdictLevel.Doubtful, ExpectedVerdict.TargetNotReachedCode, "60 mph not reached");
        }
        else if (TargetEdge.EitherVerdict(truthTopMps, topSpeedSigmaMps))
        {
            expected = expected.AtTargetEdge(truthTopMps, topSpeedSigmaMps!.Value);
        }

        return expected;
    }

    /// <summary>The accelerometer's own distance at the first foot less the true distance then,
    /// with its stated σ (m); null when the decoder gave none.</summary>
    public static Estimate? AccelFirstFootError(ReconstructedRun ours, Trajectory truth) => ours.AccelOnlyFirstFoot is { } check
        ? new Estimate(check.DistanceM - truth.ValueAt(truth.DistanceM, check.TimeS), check.SigmaM)
        : null;

    /// <summary>The naive method's figures for <paramref name="run"/>, timed by the same
    /// <see cref="FigureCalculator"/> as ours.</summary>
    public static FigureSet NaiveFigures(DecodedRun run)
    {
        ReconstructedRun naiveRun = NaiveReconstruction.Reconstruct(run);
        return FigureCalculator.Compute(naiveRun.Trajectory, naiveRun.FirstMotionS, naiveRun.RolloutM);
    }
}

/// <summary>One run's errors (estimate − truth, SI) for each <see cref="BenchFigure"/>, ours and
/// naive, with our stated σ.</summary>
/// <param name="Index">The case's position.</param>
/// <param name="Summary">The case in a few words.</param>
/// <param name="Group">Where it is reported.</param>
/// <param name="Ours">Our errors.</param>
/// <param name="Naive">The naive method's errors.</param>
/// <param name="OurSigmas">Our stated 1-σ.</param>
/// <param name="Failure">Why the case could not be compared, or null.</param>
public sealed record CaseOutcome(int Index, string Summary, BenchGroup Group, double?[] Ours, double?[] Naive, double?[] OurSigmas, string? Failure)
{
    /// <summary>True when a run that opened moving was given a figure from standstill.</summary>
    public bool StandingFigureOnRollingStart { get; init; }

    /// <summary>The accelerometer's own distance at the first foot: its error against the truth
    /// (m) with the σ the decoder states for it; null without one.</summary>
    public Estimate? AccelFirstFoot { get; init; }

    /// <summary>Per figure: true when the truth has it and the decoder reported none (it may
    /// rightly decline one it cannot support; the count shows how often).</summary>
    public bool[] Missed { get; init; } = new bool[BenchFigure.All.Count];

    /// <summary>The verdict the decoder gave the run; null when it failed.</summary>
    public Verdict? Verdict { get; init; }

    /// <summary>The verdict the run deserves, from its truth; null when it failed.</summary>
    public ExpectedVerdict? Expected { get; init; }

    /// <summary>The seed the run was drawn at, when the bench pools seeds (0 otherwise).</summary>
    public int Seed { get; init; }

    /// <summary>False when the decoder split the record into a different number of runs.</summary>
    public bool RunsAsExpected { get; init; } = true;

    /// <summary>A case that could not be decoded.</summary>
    public static CaseOutcome Failed(int index, string summary, BenchGroup group, string why)
    {
        int n = BenchFigure.All.Count;
        return new(index, summary, group, new double?[n], new double?[n], new double?[n], why);
    }

    /// <summary>Errors of <paramref name="ours"/> and <paramref name="naive"/> against <paramref name="truth"/>.</summary>
    public static CaseOutcome Compare(int index, string summary, BenchGroup group, FigureValues truth, FigureValues ours, FigureValues naive)
    {
        int n = BenchFigure.All.Count;
        var o = new double?[n];
        var v = new double?[n];
        var missed = new bool[n];
        for (int m = 0; m < n; m++)
        {
            o[m] = ours.Values[m] - truth.Values[m];
            v[m] = naive.Values[m] - truth.Values[m];
            missed[m] = truth.Values[m] is not null && ours.Values[m] is null;
        }

        return new(index, summary, group, o, v, ours.Sigmas, null) { Missed = missed };
    }
}
