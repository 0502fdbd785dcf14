namespace LaunchLogger.Archive.Importing;

/// <summary>What filing one log did.</summary>
/// <param name="Source">The log's name.</param>
/// <param name="LogId">Its id in the archive (the earlier one when it was there already).</param>
/// <param name="IsNew">False when the same bytes were in the archive already (nothing was added).</param>
/// <param name="Runs">The runs filed (empty when not new): archive run id and how the decoder judged it.</param>
public sealed record ImportOutcome(string Source, long LogId, bool IsNew, IReadOnlyList<(long RunId, AnalysedRun Run)> Runs);
