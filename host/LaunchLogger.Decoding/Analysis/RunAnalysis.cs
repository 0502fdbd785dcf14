using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>One run taken all the way: as read, as reconstructed, its figures, its stop.</summary>
public sealed class RunAnalysis
{
    /// <summary>The run as the input held it.</summary>
    public required DecodedRun Run { get; init; }

    /// <summary>The reconstructed motion.</summary>
    public required ReconstructedRun Reconstruction { get; init; }

    /// <summary>Acceleration figures under both conventions.</summary>
    public required FigureSet Figures { get; init; }

    /// <summary>The final stop, when the run ends with one.</summary>
    public BrakingResult? Braking { get; init; }

    /// <summary>Everything noticed, from reading to figures, without repeats.</summary>
    public required IReadOnlyList<string> Warnings { get; init; }
}
