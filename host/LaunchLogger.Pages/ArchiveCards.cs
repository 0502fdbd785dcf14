using System.Text.Json;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Pages;

/// <summary>Cards of archived runs. The figures are the run's current result as filed (the
/// report entry the board ranks by); the plots, and the session's grip bound and weather, come
/// from reading the run's stored log again with its filed calibration and weather, exactly as
/// import does, one run at a time from the stored blob.</summary>
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
        (long logId, string source, int position, var calibration, var weather) = archive.RunInput(runId);

        // The stored log is read from its blob and analysed run by run, as import did; of each
        // run only its report entry is kept (for the session's grip bound), and of this run its
        // plots, so a long log costs the memory of its largest run.
        IReadOnlyList<PlotFigure>? plots = null;
        StreamedSession<RunReport> session;
        using (Stream log = archive.OpenLog(logId))
        {
            IEnumerable<DecodedRun> runs = LogReader.ReadRuns(log, source, null, cancel)
                .Select(r => calibration is null ? r : CalibrationApplier.Apply(r, calibration));
            var options = AnalysisOptions.Default with { Calibration = calibration, Weather = weather };
            session = SessionAnalyzer.AnalyzeEach(
                runs,
                (analysis, at) =>
                {
                    if (at == position)
                    {
                        plots = CardPlots.For(analysis, units);
                    }

                    return RunReportBuilder.Build(analysis, at);
                },
                options,
                null,
                cancel);
        }

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
            Plots = plots ?? [],
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
