using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Truth;

namespace LaunchLogger.Simulation;

/// <summary>One simulated run: the log bytes the real firmware core wrote, and the truth.</summary>
public sealed class SimulationResult
{
    /// <summary>The scenario simulated.</summary>
    public required Scenario Scenario { get; init; }

    /// <summary>The seed used; the same scenario and seed give the same bytes.</summary>
    public required int Seed { get; init; }

    /// <summary>The log as the box would have stored it: COBS frames, zero-delimited.</summary>
    public required byte[] LogBytes { get; init; }

    /// <summary>The settings the box ran with (also in each run's configuration frame).</summary>
    public required LoggerSettings Settings { get; init; }

    /// <summary>The true trajectory on the box's clock (s): a 1 ms grid from the start of the
    /// simulation to its end, plus samples at the exact first motion, rollout and standstill.
    /// Distance is 0 at the standstill position; exact, so no σ arrays.</summary>
    public required Trajectory Truth { get; init; }

    /// <summary>True event times and values.</summary>
    public required TruthEvents Events { get; init; }

    /// <summary>What the sensors really were.</summary>
    public required SensorTruth Sensors { get; init; }

    /// <summary>The true figures, computed from <see cref="Truth"/> by the same
    /// <see cref="FigureCalculator"/> the decoder uses; null when the car never moved.</summary>
    public FigureSet? Figures { get; init; }

    /// <summary>Runs the box opened (normally 1).</summary>
    public required int BoxRuns { get; init; }

    /// <summary>The box's own first-motion estimate for its last run, s on its clock; null for none.</summary>
    public double? BoxFirstMotionS { get; init; }

    /// <summary>The box's own rollout mark for its last run, s on its clock; null for none.</summary>
    public double? BoxRolloutS { get; init; }

    /// <summary>The box's health counters at the end.</summary>
    public required HealthCounters Health { get; init; }

    /// <summary>Simulated time, s.</summary>
    public required double DurationS { get; init; }
}
