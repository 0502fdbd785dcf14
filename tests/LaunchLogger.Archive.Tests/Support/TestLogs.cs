using LaunchLogger.Archive.Importing;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Archive.Tests.Support;

/// <summary>Logs from the simulator (our own invented cars), made once per test run and shared.</summary>
internal static class TestLogs
{
    private static readonly Lazy<SimulationResult> HatchRun = new(() => Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 2));
    private static readonly Lazy<SimulationResult> SecondHatchRun = new(() => Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 3));
    private static readonly Lazy<SimulationResult> RoadsterRun = new(() => Simulator.Run(BuiltInScenarios.Default, seed: 5));
    private static readonly Lazy<AnalysedLog> HatchAnalysis = new(() => LogAnalyzer.Analyze(Hatch, "hatch.log", "test"));

    /// <summary>A family hatchback's launch and stop.</summary>
    public static byte[] Hatch => HatchRun.Value.LogBytes;

    /// <summary>The same hatchback, another launch.</summary>
    public static byte[] SecondHatch => SecondHatchRun.Value.LogBytes;

    /// <summary>The default roadster's quarter mile.</summary>
    public static byte[] Roadster => RoadsterRun.Value.LogBytes;

    /// <summary>The hatch log analysed.</summary>
    public static AnalysedLog HatchAnalysed => HatchAnalysis.Value;

    /// <summary>The same log made distinct by <paramref name="extra"/> trailing frame delimiters,
    /// which every reader skips (empty frames): a different content hash, the same runs.</summary>
    public static byte[] Variant(byte[] log, int extra) => [.. log, .. new byte[extra]];
}
