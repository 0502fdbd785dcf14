namespace LaunchLogger.Archive.Importing;

/// <summary>What filing one log did.</summary>
/// <param name="Source">The log's name.</param>
/// <param name="LogId">Its id in the archive (the earlier one when it was there already).</param>
/// <param name="IsNew">False when the same bytes were in the archive already (nothing was added).</param>
/// <param name="Runs">The runs filed (empty when not new): archive run id and how the decoder judged it.</param>
public sealed record ImportOutcome(string Source, long LogId, bool IsNew, IReadOnlyList<(long RunId, AnalysedRun Run)> Runs)
{
    /// <summary>Runs of this log that were filed already from another copy of the box's bytes
    /// (a live capture, say): not filed twice.</summary>
    public IReadOnlyList<KnownRun> Known { get; init; } = [];
}

/// <summary>A run found in a new log that the archive holds already from another copy.</summary>
/// <param name="RunId">The archived run.</param>
/// <param name="Run">This copy of it.</param>
/// <param name="TookOver">True when this copy lost fewer frames and now carries the run (its
/// result is the run's current one; the earlier result stays in the history).</param>
public sealed record KnownRun(long RunId, AnalysedRun Run, bool TookOver);
