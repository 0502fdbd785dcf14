using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Our run and another instrument's record of it, figure by figure.</summary>
public sealed record CrossCheckResult
{
    /// <summary>What the other record was.</summary>
    public required string Source { get; init; }

    /// <summary>Its median sample rate, Hz.</summary>
    public required double SampleRateHz { get; init; }

    /// <summary>Whether its speeds were measured (true) or differenced from positions.</summary>
    public required bool SpeedMeasured { get; init; }

    /// <summary>Records read and refused (bad checksums, no fix…).</summary>
    public required int RecordsRead { get; init; }

    /// <summary>Records refused.</summary>
    public required int RecordsRejected { get; init; }

    /// <summary>The speed noise assumed for the other record, m/s (1-σ).</summary>
    public required double SpeedSigmaMps { get; init; }

    /// <summary>How its clock lines up with ours.</summary>
    public required TraceAlignment Alignment { get; init; }

    /// <summary>Its trajectory on our clock.</summary>
    public required Trajectory TheirTrajectory { get; init; }

    /// <summary>Its figures by our definitions.</summary>
    public required FigureSet TheirFigures { get; init; }

    /// <summary>Every figure both records give.</summary>
    public required IReadOnlyList<CrossCheckRow> Rows { get; init; }

    /// <summary>What the other record's sample rate allows, in words.</summary>
    public required IReadOnlyList<string> Notes { get; init; }
}
