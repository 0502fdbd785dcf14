namespace LaunchLogger.Archive.Board;

/// <summary>Which verdicts the board accepts.</summary>
public enum Acceptance
{
    /// <summary>Valid runs only (the default).</summary>
    Valid,

    /// <summary>Valid and doubtful runs.</summary>
    Doubtful,

    /// <summary>Every run that has the figure, invalid ones too.</summary>
    All,
}
