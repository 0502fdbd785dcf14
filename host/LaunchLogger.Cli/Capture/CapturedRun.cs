using LaunchLogger.Archive.Importing;

namespace LaunchLogger.Cli.Capture;

/// <summary>A run that closed during a capture.</summary>
/// <param name="Analysis">Its log slice, analysed.</param>
/// <param name="RunId">Its archive run id, when filed.</param>
/// <param name="Gaps">Link gaps inside its bytes.</param>
public sealed record CapturedRun(AnalysedRun Analysis, long? RunId, IReadOnlyList<LinkGap> Gaps);
