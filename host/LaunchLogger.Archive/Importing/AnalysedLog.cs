namespace LaunchLogger.Archive.Importing;

/// <summary>A log read, hashed and analysed, ready to be filed in one transaction.</summary>
/// <param name="Sha256">The content hash (lower-case hex) that makes filing idempotent.</param>
/// <param name="Source">Its name (file or capture).</param>
/// <param name="Bytes">The raw bytes, kept as they came; empty when they stay in
/// <see cref="BytesFile"/> until the log is filed.</param>
/// <param name="Runs">Its runs in log order.</param>
/// <param name="Warnings">Problems outside any run.</param>
/// <param name="ToolVersion">The tool that made the results.</param>
public sealed record AnalysedLog(string Sha256, string Source, byte[] Bytes, IReadOnlyList<AnalysedRun> Runs, IReadOnlyList<string> Warnings, string ToolVersion)
{
    /// <summary>The file holding the raw bytes when they are not in <see cref="Bytes"/>
    /// (<see cref="LogAnalyzer.AnalyzeFile"/>): they are copied from it into the archive when the
    /// log is filed, so a long log is never held whole, and checked against <see cref="Sha256"/> then.</summary>
    public string? BytesFile { get; init; }

    /// <summary>The log's length in bytes, wherever its bytes are.</summary>
    public long ByteCount => BytesFile is null ? Bytes.LongLength : BytesFileLength;

    /// <summary>The length of <see cref="BytesFile"/> when it was analysed.</summary>
    public long BytesFileLength { get; init; }
}
