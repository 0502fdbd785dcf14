using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Plots.Tests;

/// <summary>Runs analysed from built-in scenarios, simulated once per test run.</summary>
public static class SimulatedRuns
{
    private static readonly Lazy<RunAnalysis> LaunchRun = new(() => Analyse("roadster-launch", 1)[0]);
    private static readonly Lazy<RunAnalysis> StopRun = new(() => Analyse("brake-test-60", 1).First(r => r.Braking != null));

    /// <summary>A launch (the default scenario).</summary>
    public static RunAnalysis Launch => LaunchRun.Value;

    /// <summary>A run ending in a stop.</summary>
    public static RunAnalysis Stop => StopRun.Value;

    /// <summary>Every run of a scenario, analysed.</summary>
    public static IReadOnlyList<RunAnalysis> Analyse(string scenario, int seed)
    {
        SimulationResult simulation = Simulator.Run(BuiltInScenarios.Get(scenario), seed);
        LogReadResult log = LogReader.Read(simulation.LogBytes, scenario + ".log");
        return SessionAnalyzer.Analyze(log.Runs).Runs;
    }
}
