using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>One run taken all the way: as read, as reconstructed, its figures, its stop.</summary>
public sealed record RunAnalysis
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

    /// <summary>The road's grade at staging, when the accelerometer gave a resting pitch.</summary>
    public GradeEstimate? Grade { get; init; }

    /// <summary>Figures re-timed for level ground, when the grade is known.</summary>
    public FigureSet? LevelFigures { get; init; }

    /// <summary>Figures corrected to standard air, when the weather was given.</summary>
    public FigureSet? StandardAirFigures { get; init; }

    /// <summary>The verdict; set once the whole session is known (the braking bound may come
    /// from another run).</summary>
    public Verdict? Verdict { get; init; }

    /// <summary>This analysis with its verdict set.</summary>
    public RunAnalysis WithVerdict(Verdict verdict) => this with { Verdict = verdict };
}
