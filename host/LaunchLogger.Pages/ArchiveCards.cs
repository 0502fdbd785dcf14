using System.Text.Json;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Pages;

/// <summary>Cards of archived runs. The figures are the run's current result as filed (the
/// report entry the board ranks by); the plots, and the session's grip bound and weather, come
/// from reading the run's stored log again with its filed calibration and weather, exactly as
/// import does (<see cref="LogAnalyzer.AnalyzeSession"/>).</summary>
public static class ArchiveCards
{
    /// <summary>The card of archive run <paramref name="runId"/>, or null when its analysis failed
    /// (then <paramref name="failure"/> says why).</summary>
    /// <exception cref="ArchiveException">No such run.</exception>
    public static CardInput? Card(SessionArchive archive, long runId, DisplayUnits units, string toolVersion, out string? failure, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(archive);
        FiledRun filed = archive.FiledRun(runId);
        if (filed.ReportJson is null)
        {
            failure = filed.Failure ?? "the run has no result";
            return null;
        }

        RunReport run = JsonSerializer.Deserialize<RunReport>(filed.ReportJson, ReportJson.Options)
            ?? throw new ArchiveException($"run {runId}: its stored report entry is empty");
        (byte[] bytes, string source, int position, var calibration, var weather) = archive.RunInput(runId);
        var (_, _, session) = LogAnalyzer.AnalyzeSession(bytes, source, calibration, weather, cancel);
        RunAnalysis? analysis = position >= 1 && position <= session.Runs.Count ? session.Runs[position - 1] : null;
        ReportDocument document = RunReportBuilder.Document(session, toolVersion, source, null, weather, []);

        // The session's bound belongs to this result only when this tool made the result.
        bool sameTool = filed.ToolVersion == toolVersion;
        failure = null;
        return new CardInput
        {
            Run = run,
            TractionBound = sameTool ? document.TractionBound : null,
            BoundNote = sameTool ? null : $"This result was made by launchlogger {filed.ToolVersion}; the grip bound it was judged against is not derived again here (launchlogger reanalyse brings the archive's results up to this version, {toolVersion}).",
            Weather = document.Weather,
            Filed = filed,
            ToolVersion = filed.ToolVersion ?? toolVersion,
            Units = units,
            Plots = analysis is null ? [] : CardPlots.For(analysis, units),
        };
    }

    /// <summary>The card of a run whose analysis failed: who and where, and why.</summary>
    public static string FailedCard(FiledRun filed)
    {
        ArgumentNullException.ThrowIfNull(filed);
        return $"<article class=\"card\" data-archive-run=\"{filed.RunId}\" data-verdict=\"failed\"><header class=\"ident\"><div><h1>Archive run {filed.RunId}</h1>"
            + $"<p class=\"who\">{HtmlPage.Encode(string.Join(" · ", new[] { filed.Driver, filed.Car, filed.Event }.Where(s => s is not null)))}</p></div>"
            + "<div class=\"badge failed\" data-role=\"verdict\">failed</div></header>"
            + $"<p>{HtmlPage.Encode(RunCard.VerdictWords("failed"))}: {HtmlPage.Encode(filed.Failure ?? "no result")}.</p></article>\n";
    }
}
