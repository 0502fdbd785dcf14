using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;

namespace LaunchLogger.Cli.Bench;

/// <summary>Runs simulated launches through the firmware core and the decoder, and compares our
/// estimator and the naive method (first edge = start, linear interpolation) with the truth.</summary>
public static class AccuracyBenchmark
{
    /// <summary>The figures compared, in table order.</summary>
    public static readonly IReadOnlyList<Metric> Metrics =
    [
        new("first motion", "ms", 1000, f => f.FirstMotionS.Value, f => f.FirstMotionS.Sigma),
        new("rollout mark", "ms", 1000, f => f.RolloutTimeS?.Value, f => f.RolloutTimeS?.Sigma),
        new("0-60 mph from standstill", "ms", 1000, f => Interval(f)?.FromStandstillS, f => Interval(f)?.UncertaintyS),
        new("0-60 mph after rollout", "ms", 1000, f => Interval(f)?.FromRolloutS, f => Interval(f)?.FromRolloutUncertaintyS),
        new("1/4 mile elapsed time", "ms", 1000, f => Quarter(f)?.FromStandstillS, f => Quarter(f)?.UncertaintyS),
        new("1/4 mile trap speed", "m/s", 1, f => Quarter(f)?.TrapSpeedMps, f => Quarter(f)?.TrapSpeedUncertaintyMps),
    ];

    /// <summary>Simulates and decodes one case.</summary>
    public static CaseOutcome Run(AccuracyCase c, CancellationToken cancel)
    {
        cancel.ThrowIfCancellationRequested();
        SimulationResult simulation;
        try
        {
            simulation = Simulator.Run(c.Scenario, c.Seed, cancel);
        }
        catch (ArgumentException e)
        {
            return CaseOutcome.Failed(c, $"the scenario was refused: {e.Message}");
        }

        if (simulation.Figures is not { } truth)
        {
            return CaseOutcome.Failed(c, "the simulation produced no truth figures");
        }

        LogReadResult log = LogReader.Read(simulation.LogBytes, c.Scenario.Name);
        DecodedRun? run = log.Runs.OrderByDescending(r => r.Pulses.Count).FirstOrDefault();
        if (run is null)
        {
            return CaseOutcome.Failed(c, "the box logged no run");
        }

        FigureSet ours;
        FigureSet naive;
        try
        {
            ours = RunAnalyzer.Analyze(run).Figures;
            ReconstructedRun naiveRun = NaiveReconstruction.Reconstruct(run);
            naive = FigureCalculator.Compute(naiveRun.Trajectory, naiveRun.FirstMotionS, naiveRun.RolloutM);
        }
        catch (Exception e) when (e is AnalysisException or InvalidOperationException)
        {
            return CaseOutcome.Failed(c, e.Message);
        }

        // Truth figures are on the same clock as the log: the simulator writes its truth in the
        // box's time.
        FigureSet truthAligned = truth with { FirstMotionS = new Estimate(simulation.Events.FirstMotionS ?? truth.FirstMotionS.Value, 0) };
        var ourErrors = new double?[Metrics.Count];
        var naiveErrors = new double?[Metrics.Count];
        var sigmas = new double?[Metrics.Count];
        for (int m = 0; m < Metrics.Count; m++)
        {
            double? t = Metrics[m].Value(truthAligned);
            ourErrors[m] = Metrics[m].Value(ours) - t;
            naiveErrors[m] = Metrics[m].Value(naive) - t;
            sigmas[m] = Metrics[m].Sigma(ours);
        }

        return new CaseOutcome(c, ourErrors, naiveErrors, sigmas, null);
    }

    private static IntervalFigure? Interval(FigureSet f) => f.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == "0-60 mph");

    private static MarkFigure? Quarter(FigureSet f) => f.DistanceMarks.FirstOrDefault(m => Math.Abs(m.Mark.DistanceM - (1320 * Units.MetresPerFoot)) < 1e-6);
}

/// <summary>A figure the benchmark compares.</summary>
/// <param name="Name">What it is.</param>
/// <param name="Unit">Unit of the printed errors.</param>
/// <param name="Scale">Factor from SI to that unit.</param>
/// <param name="Value">Reads the figure (SI) from a figure set.</param>
/// <param name="Sigma">Reads its claimed 1-σ (SI).</param>
public sealed record Metric(string Name, string Unit, double Scale, Func<FigureSet, double?> Value, Func<FigureSet, double?> Sigma);

/// <summary>One case's errors (estimate − truth, SI) for each metric, ours and naive.</summary>
public sealed record CaseOutcome(AccuracyCase Case, double?[] Ours, double?[] Naive, double?[] OurSigmas, string? Failure)
{
    /// <summary>A case that could not be decoded.</summary>
    public static CaseOutcome Failed(AccuracyCase c, string why) =>
        new(c, new double?[AccuracyBenchmark.Metrics.Count], new double?[AccuracyBenchmark.Metrics.Count], new double?[AccuracyBenchmark.Metrics.Count], why);
}
