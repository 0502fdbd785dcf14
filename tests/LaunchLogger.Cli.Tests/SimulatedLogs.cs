using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Tests;

/// <summary>Logs from the simulator, made once per test run and shared.</summary>
internal static class SimulatedLogs
{
    private static readonly Lazy<SimulationResult> DefaultRun = new(() => Simulator.Run(BuiltInScenarios.Default, seed: 3));
    private static readonly Lazy<SimulationResult> BrakeRun = new(() => Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed: 3));

    public static SimulationResult Default => DefaultRun.Value;

    public static SimulationResult BrakeTest => BrakeRun.Value;
}
