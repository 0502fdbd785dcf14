using LaunchLogger.Archive.Importing;

namespace LaunchLogger.Cli.Capture;

/// <summary>What a capture did.</summary>
/// <param name="Bytes">Bytes received and written.</param>
/// <param name="Runs">Runs that closed (or were cut off at the end), in order.</param>
/// <param name="Gaps">Every time the link was down.</param>
/// <param name="Problems">Runs that could not be filed, one line each.</param>
public sealed record CaptureResult(long Bytes, IReadOnlyList<CapturedRun> Runs, IReadOnlyList<LinkGap> Gaps, IReadOnlyList<string> Problems);
