using System.Security.Cryptography;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Archive.Importing;

/// <summary>Reads and analyses a log exactly as <c>launchlogger report</c> does (the same reader,
/// analyzer and report builder), so the archive holds the figures the report gives.</summary>
/// <remarks>Thread-safe: imports analyse several logs at once and file them one by one.</remarks>
public static class LogAnalyzer
{
    /// <summary>The content hash of a log: SHA-256 (FIPS 180-4), lower-case hex.</summary>
    public static string Hash(ReadOnlySpan<byte> bytes) => Convert.ToHexStringLower(SHA256.HashData(bytes));

    /// <summary>What names a run whichever copy of the box's bytes holds it: the firmware, the
    /// box's run number, the box clock's time when the run opened and its pickup, hashed. A run
    /// captured live over a link with gaps and the same run read later from the box's card give
    /// the same fingerprint although their bytes differ; two runs of one box never share one,
    /// since within one power-up the box's clock only moves forward.</summary>
    public static string Fingerprint(DecodedRun run)
    {
        ArgumentNullException.ThrowIfNull(run);
        RunConfiguration c = run.Configuration;
        string key = string.Create(
            System.Globalization.CultureInfo.InvariantCulture,
            $"{c.FirmwareVersion}|{c.RunNumber}|{Math.Round(c.OpenedS * 1e6):F0}|{c.PulsesPerRevolution}|{c.FormatVersion}");
        return Hash(System.Text.Encoding.UTF8.GetBytes(key))[..32];
    }

    /// <summary>The content hash of a log file (as <see cref="Hash"/>), read in blocks.</summary>
    /// <exception cref="IOException">The file cannot be read.</exception>
    public static string HashFile(string path)
    {
        using FileStream stream = File.OpenRead(path);
        return Convert.ToHexStringLower(SHA256.HashData(stream));
    }

    /// <summary>Analyses every run of <paramref name="bytes"/>.</summary>
    /// <param name="bytes">The whole log.</param>
    /// <param name="source">Its name.</param>
    /// <param name="toolVersion">The tool version recorded with the results.</param>
    /// <param name="calibration">The car's calibration settings, when known.</param>
    /// <param name="weather">The event's weather, when known.</param>
    /// <param name="cancel">Stops between runs.</param>
    public static AnalysedLog Analyze(byte[] bytes, string source, string toolVersion, CalibrationSettings? calibration = null, Weather? weather = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        (List<AnalysedRun> runs, IReadOnlyList<string> warnings) = AnalyzeRuns(new MemoryStream(bytes, writable: false), source, calibration, weather, cancel);
        return new AnalysedLog(Hash(bytes), source, bytes, runs, warnings, toolVersion);
    }

    /// <summary>As <see cref="Analyze"/> for a log file, read one run at a time: memory is bounded
    /// by its largest run, not by the file. The bytes stay in the file
    /// (<see cref="AnalysedLog.BytesFile"/>) and are copied into the archive when it is filed.</summary>
    /// <param name="path">The log file.</param>
    /// <param name="sha256">Its content hash (<see cref="HashFile"/>), checked again when it is filed.</param>
    /// <param name="source">Its name.</param>
    /// <param name="toolVersion">The tool version recorded with the results.</param>
    /// <param name="calibration">The car's calibration settings, when known.</param>
    /// <param name="weather">The event's weather, when known.</param>
    /// <param name="cancel">Stops between runs.</param>
    /// <exception cref="IOException">The file cannot be read.</exception>
    public static AnalysedLog AnalyzeFile(string path, string sha256, string source, string toolVersion, CalibrationSettings? calibration = null, Weather? weather = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(path);
        using FileStream stream = File.OpenRead(path);
        long length = stream.Length;
        (List<AnalysedRun> runs, IReadOnlyList<string> warnings) = AnalyzeRuns(stream, source, calibration, weather, cancel);
        return new AnalysedLog(sha256, source, [], runs, warnings, toolVersion) { BytesFile = Path.GetFullPath(path), BytesFileLength = length };
    }

    /// <summary>As <see cref="Analyze"/> for a log read from a stream (a stored log's blob), one
    /// run at a time: memory is bounded by its largest run, not by the log.</summary>
    /// <param name="stream">The log; read to its end, not closed.</param>
    /// <param name="sha256">Its content hash, as filed.</param>
    /// <param name="source">Its name.</param>
    /// <param name="toolVersion">The tool version recorded with the results.</param>
    /// <param name="calibration">The car's calibration settings, when known.</param>
    /// <param name="weather">The event's weather, when known.</param>
    /// <param name="cancel">Stops between runs.</param>
    public static AnalysedLog AnalyzeStream(Stream stream, string sha256, string source, string toolVersion, CalibrationSettings? calibration = null, Weather? weather = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(stream);
        (List<AnalysedRun> runs, IReadOnlyList<string> warnings) = AnalyzeRuns(stream, source, calibration, weather, cancel);
        return new AnalysedLog(sha256, source, [], runs, warnings, toolVersion);
    }

    /// <summary>Reads, analyses and reports the runs of a log as the report does, one at a time,
    /// keeping of each only its report entry (with the session's final verdict) and what names it.</summary>
    private static (List<AnalysedRun> Runs, IReadOnlyList<string> Warnings) AnalyzeRuns(Stream stream, string source, CalibrationSettings? calibration, Weather? weather, CancellationToken cancel)
    {
        IReadOnlyList<string> warnings = [];
        var decoded = new List<AnalysedRun>();
        DecodedRun? current = null;
        IEnumerable<DecodedRun> runs = LogReader.ReadRuns(stream, source, end => warnings = end.Warnings, cancel)
            .Select(r =>
            {
                current = calibration is null ? r : CalibrationApplier.Apply(r, calibration);
                int position = decoded.Count + 1;
                decoded.Add(new AnalysedRun(position, current.Configuration.RunNumber, current.Configuration.FirmwareVersion, current.Source, null, null)
                {
                    Fingerprint = Fingerprint(current),
                    FramesLost = current.FramesLost,
                });
                return current;
            });
        var options = AnalysisOptions.Default with { Calibration = calibration, Weather = weather };

        // The run of the log an analysis belongs to when it is that run whole (a record the
        // splitter cut into several runs is not one of the log's runs: it stays unreported).
        StreamedSession<(int Position, RunReport Report)?> session = SessionAnalyzer.AnalyzeEach<(int Position, RunReport Report)?>(
            runs,
            (analysis, _) => ReferenceEquals(analysis.Run, current) ? (decoded.Count, RunReportBuilder.Build(analysis, decoded.Count)) : null,
            options,
            null,
            cancel);
        var analysed = new List<AnalysedRun>(decoded.Count);
        foreach (AnalysedRun run in decoded)
        {
            StreamedRun<(int Position, RunReport Report)?>? kept = session.Runs.FirstOrDefault(r => r.Kept?.Position == run.Position);
            analysed.Add(kept?.Kept is { } k
                ? run with { Report = k.Report with { Verdict = RunReportBuilder.Verdict(kept.Verdict) } }
                : run with { Failure = session.Failures.FirstOrDefault(f => f.Contains(run.Source, StringComparison.Ordinal)) ?? "the run could not be analysed" });
        }

        return (analysed, warnings);
    }
}
