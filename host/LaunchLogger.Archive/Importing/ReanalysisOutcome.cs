namespace LaunchLogger.Archive.Importing;

/// <summary>What a re-analysis did.</summary>
/// <param name="Logs">Logs read again.</param>
/// <param name="Runs">Runs given a new result.</param>
/// <param name="VerdictsChanged">Runs whose verdict changed.</param>
public sealed record ReanalysisOutcome(int Logs, int Runs, int VerdictsChanged);
