namespace LaunchLogger.Archive.Records;

/// <summary>Whether a run counts on the board, as the organiser decided.</summary>
public enum RunStanding
{
    /// <summary>Counts (the default).</summary>
    Counted,

    /// <summary>Void: a rerun was granted (a timing fault, a track obstruction…).</summary>
    Rerun,

    /// <summary>Disqualified by the organiser.</summary>
    Disqualified,
}
