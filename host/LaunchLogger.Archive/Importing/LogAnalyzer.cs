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
        (LogReadResult read, List<DecodedRun> runs, SessionAnalysis session) = AnalyzeSession(bytes, source, calibration, weather, cancel);
        var analysed = new List<AnalysedRun>(runs.Count);
        for (int i = 0; i < runs.Count; i++)
        {
            DecodedRun run = runs[i];
            RunAnalysis? analysis = session.Runs.FirstOrDefault(a => ReferenceEquals(a.Run, run));
            analysed.Add(new AnalysedRun(
                i + 1,
                run.Configuration.RunNumber,
                run.Configuration.FirmwareVersion,
                run.Source,
                analysis is null ? null : RunReportBuilder.Build(analysis, i + 1),
                analysis is null ? session.Failures.FirstOrDefault(f => f.Contains(run.Source, StringComparison.Ordinal)) ?? "the run could not be analysed" : null)
            {
                Fingerprint = Fingerprint(run),
                FramesLost = run.FramesLost,
            });
        }

        return new AnalysedLog(Hash(bytes), source, bytes, analysed, read.Warnings, toolVersion);
    }

    /// <summary>Reads and analyses every run of <paramref name="bytes"/> as the report does: the
    /// log as read, its runs with the calibration applied, and the session's analysis (what the
    /// run cards draw their plots and the session's grip bound from).</summary>
    public static (LogReadResult Read, List<DecodedRun> Runs, SessionAnalysis Session) AnalyzeSession(byte[] bytes, string source, CalibrationSettings? calibration = null, Weather? weather = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        LogReadResult read = LogReader.Read(bytes, source);
        List<DecodedRun> runs = read.Runs.Select(r => calibration is null ? r : CalibrationApplier.Apply(r, calibration)).ToList();
        var options = AnalysisOptions.Default with { Calibration = calibration, Weather = weather };
        return (read, runs, SessionAnalyzer.Analyze(runs, options, null, cancel));
    }
}
