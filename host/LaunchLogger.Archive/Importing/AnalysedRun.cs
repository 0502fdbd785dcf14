using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Archive.Importing;

/// <summary>One run of a log as the decoder judged it: its report entry, or why it has none.</summary>
/// <param name="Position">Its place in the log, 1-based.</param>
/// <param name="BoxRun">The box's run number.</param>
/// <param name="Firmware">The firmware version in its configuration.</param>
/// <param name="Source">Where it came from (log and run).</param>
/// <param name="Report">The report entry; null when analysis failed.</param>
/// <param name="Failure">Why analysis failed; null when it did not.</param>
public sealed record AnalysedRun(int Position, int BoxRun, string Firmware, string Source, RunReport? Report, string? Failure)
{
    /// <summary>"valid", "doubtful", "invalid" or "failed".</summary>
    public string Verdict => Report?.Verdict?.Level ?? "failed";

    /// <summary>What names this run whichever copy of the box's bytes it came from (the live
    /// capture or the card): see <see cref="LogAnalyzer.Fingerprint"/>. Null when unknown.</summary>
    public string? Fingerprint { get; init; }

    /// <summary>Frames the reader found missing in this copy of the run.</summary>
    public long FramesLost { get; init; }
}
