using LaunchLogger.Decoding.Reading;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Everything read from one log: its runs, the reader's counters and what went wrong
/// outside any run.</summary>
public sealed class LogReadResult
{
    /// <summary>The log's name as given to the reader (a file name, a port).</summary>
    public required string Source { get; init; }

    /// <summary>The runs in log order, complete or not.</summary>
    public required IReadOnlyList<DecodedRun> Runs { get; init; }

    /// <summary>The bench rests in log order (LOG-FORMAT.md, 0x09): no runs, kept apart so that
    /// nothing that takes runs sees them.</summary>
    public IReadOnlyList<BenchRestRecord> BenchRests { get; init; } = [];

    /// <summary>Counters of frames, damage and gaps over the whole log.</summary>
    public required ReaderStats Stats { get; init; }

    /// <summary>Problems not tied to one run: frames outside any run, damage between runs, an
    /// unreadable log. Each run carries its own warnings.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}
