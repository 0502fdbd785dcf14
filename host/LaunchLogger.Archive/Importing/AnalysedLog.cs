namespace LaunchLogger.Archive.Importing;

/// <summary>A log read, hashed and analysed, ready to be filed in one transaction.</summary>
/// <param name="Sha256">The content hash (lower-case hex) that makes filing idempotent.</param>
/// <param name="Source">Its name (file or capture).</param>
/// <param name="Bytes">The raw bytes, kept as they came.</param>
/// <param name="Runs">Its runs in log order.</param>
/// <param name="Warnings">Problems outside any run.</param>
/// <param name="ToolVersion">The tool that made the results.</param>
public sealed record AnalysedLog(string Sha256, string Source, byte[] Bytes, IReadOnlyList<AnalysedRun> Runs, IReadOnlyList<string> Warnings, string ToolVersion);
