using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Plots.Tests;

/// <summary>Runs analysed from built-in scenarios, simulated once per test run.</summary>
public static class SimulatedRuns
{
    private static readonly Lazy<RunAnalysis> LaunchRun = new(() => Analyse("roadster-launch", 1)[0]);
    private static readonly Lazy<RunAnalysis> StopRun = new(() => Analyse("brake-test-60", 1).First(r => r.Braking != null));

    /// <summary>A launch that ends in a stop (the default scenario).</summary>
    public static RunAnalysis Launch => LaunchRun.Value;

    /// <summary>A brake test: a run ending in a firm stop.</summary>
    public static RunAnalysis Stop => StopRun.Value;

    /// <summary>Every run of a scenario, analysed.</summary>
    public static IReadOnlyList<RunAnalysis> Analyse(string scenario, int seed)
    {
        SimulationResult simulation = Simulator.Run(BuiltInScenarios.Get(scenario), seed);
        LogReadResult log = LogReader.Read(simulation.LogBytes, scenario + ".log");
        return SessionAnalyzer.Analyze(log.Runs).Runs;
    }

    /// <summary>The run as if its trajectory came without σ columns (as a truth trajectory does).</summary>
    public static RunAnalysis WithoutSigma(RunAnalysis run)
    {
        Trajectory t = run.Reconstruction.Trajectory;
        return Rebuilt(run, new Trajectory { TimeS = t.TimeS, DistanceM = t.DistanceM, SpeedMps = t.SpeedMps, AccelMps2 = t.AccelMps2 }, staged: true);
    }

    /// <summary>The run as if its record had opened moving (no standstill seen).</summary>
    public static RunAnalysis OpenedMoving(RunAnalysis run) => Rebuilt(run, run.Reconstruction.Trajectory, staged: false);

    private static RunAnalysis Rebuilt(RunAnalysis run, Trajectory bare, bool staged)
    {
        ReconstructedRun r = run.Reconstruction;
        var recon = new ReconstructedRun
        {
            Source = r.Source,
            Trajectory = bare,
            FirstMotionS = r.FirstMotionS,
            RolloutTimeS = r.RolloutTimeS,
            RolloutSpeedMps = r.RolloutSpeedMps,
            RolloutM = r.RolloutM,
            Method = r.Method,
            Warnings = r.Warnings,
            Staged = staged,
        };
        return run with { Reconstruction = recon };
    }

    /// <summary>Another instrument's 10 Hz speed record of <paramref name="run"/>, on a clock
    /// 1000 s ahead of ours, and the cross-check of the two.</summary>
    public static CrossCheckResult CrossCheckAt10Hz(RunAnalysis run)
    {
        Trajectory t = run.Reconstruction.Trajectory;
        var times = new List<double>();
        for (double at = t.TimeS[0]; at <= t.TimeS[^1]; at += 0.1)
        {
            times.Add(at);
        }

        var trace = new SpeedTrace
        {
            TimeS = times.Select(x => x + 1000).ToArray(),
            SpeedMps = times.Select(x => t.ValueAt(t.SpeedMps, x)).ToArray(),
            SpeedMeasured = true,
            Source = "other-logger.csv",
            RecordsRead = times.Count,
        };
        return CrossChecker.Compare(run, trace);
    }
}
