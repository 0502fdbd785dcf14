using System.CommandLine;
using System.Text;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Pages;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger card</c>: run cards as one self-contained HTML file, from logs (read
/// and analysed as <c>report</c> does), from a saved <c>report --json</c> document, or from the
/// archive by run id.</summary>
public static class CardCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var logs = new Argument<FileInfo[]>("log") { Description = "Log files written by the box.", Arity = ArgumentArity.ZeroOrMore }.RejectingUnknownOptions();
        var fromJson = new Option<FileInfo?>("--report-json") { Description = "A document written by launchlogger report --json, instead of logs (cards without plots)." };
        var archived = new Option<long?>("--archived") { Description = "The archive's run id (launchlogger run list) instead of logs." };
        var index = new Option<int?>("--index") { Description = "Only this run, by its index in the report (1 first); default: every run, one card each." };
        var output = new Option<FileInfo>("--out") { Description = "The HTML file to write.", Required = true };
        var units = new Option<DisplayUnits>("--units") { Description = "imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var settings = new Option<FileInfo?>("--settings") { Description = "Calibration settings file, as for report." };
        var weather = new Option<string?>("--weather") { Description = "Weather during the runs: T_C,P_hPa,RH_pct, as for report." };
        var brakeReference = new Option<FileInfo?>("--brake-reference") { Description = "A log with a stop at the grip limit, as for report." };
        var archive = ArchiveSupport.ArchiveOption();
        var command = new Command("card", "Write run cards as one HTML file (inline plots and print stylesheet; print it from a browser): both conventions side by side, the verdict in words, the stop and grip bound, corrections, the box.")
        {
            logs, fromJson, archived, index, output, units, settings, weather, brakeReference, archive,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new ReportRequest
            {
                Logs = parse.GetValue(logs) ?? [],
                Settings = parse.GetValue(settings),
                Weather = parse.GetValue(weather),
                BrakeReference = parse.GetValue(brakeReference),
            },
            parse.GetValue(fromJson),
            parse.GetValue(archived),
            parse.GetValue(archive)?.FullName,
            parse.GetValue(index),
            parse.GetValue(output)!,
            parse.GetValue(units),
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb: exactly one source (logs, a report document or an archived run).</summary>
    public static ExitCode Run(ReportRequest logs, FileInfo? reportJson, long? archivedRun, string? archivePath, int? index, FileInfo file, DisplayUnits units, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(logs);
        ArgumentNullException.ThrowIfNull(file);
        int sources = (logs.Logs.Count > 0 ? 1 : 0) + (reportJson is null ? 0 : 1) + (archivedRun is null ? 0 : 1);
        if (sources != 1)
        {
            error.WriteLine("launchlogger card: give one of: log files, --report-json FILE, or --archived RUN_ID");
            return ExitCode.Usage;
        }

        if (archivedRun is { } runId)
        {
            return ArchiveSupport.With(archivePath, "card", error, archive =>
            {
                CardInput? card = ArchiveCards.Card(archive, runId, units, ToolInfo.Version, out string? failure, cancel);
                if (card is null)
                {
                    error.WriteLine($"launchlogger card: run {runId} has no figures to show: {failure}");
                    return ExitCode.Partial;
                }

                return Write(file, RunCard.Page(card), [card], output, error, cancel);
            }, readOnly: true);
        }

        List<CardInput> cards;
        ExitCode code;
        if (reportJson is not null)
        {
            ReportDocument? document;
            try
            {
                document = ReportJson.Deserialize(File.ReadAllText(reportJson.FullName));
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or System.Text.Json.JsonException)
            {
                error.WriteLine($"launchlogger card: {reportJson.FullName}: not a report document: {e.Message}");
                return ExitCode.BadInput;
            }

            if (document is null || document.Format != "launchlogger-report" || document.Runs is null)
            {
                error.WriteLine($"launchlogger card: {reportJson.FullName}: not a report document (launchlogger report --json)");
                return ExitCode.BadInput;
            }

            cards = document.Runs.Select(run => Card(document, run, units, [])).ToList();
            code = document.Runs.All(r => r.Verdict is null || r.Verdict.Level == "valid") ? ExitCode.Ok : ExitCode.Partial;
        }
        else
        {
            ReportCommand.Analysed? analysed = ReportCommand.Analyse(logs, "card", error, out ExitCode failed, cancel, keepRuns: true);
            if (analysed is null)
            {
                return failed;
            }

            cards = analysed.Document.Runs.Select((run, i) => Card(analysed.Document, run, units, CardPlots.For(analysed.Session!.Runs[i], units))).ToList();
            code = analysed.Code;
        }

        if (index is { } wanted)
        {
            if (wanted < 1 || wanted > cards.Count)
            {
                error.WriteLine($"launchlogger card: --index {wanted}: the input has runs 1 to {cards.Count}");
                return ExitCode.Usage;
            }

            cards = [cards[wanted - 1]];
        }

        var body = new StringBuilder();
        foreach (CardInput card in cards)
        {
            RunCard.Append(body, card);
        }

        string title = cards.Count == 1 ? RunCard.Title(cards[0]) : $"Run cards: {cards.Count} runs";
        ExitCode written = Write(file, HtmlPage.Document(title, body.ToString(), RunCard.FootNote(ToolInfo.Version)), cards, output, error, cancel);
        return written == ExitCode.Ok ? code : written;
    }

    private static CardInput Card(ReportDocument document, RunReport run, DisplayUnits units, IReadOnlyList<PlotFigure> plots) => new()
    {
        Run = run,
        TractionBound = document.TractionBound,
        Weather = document.Weather,
        ToolVersion = document.ToolVersion,
        Units = units,
        Plots = plots,
    };

    private static ExitCode Write(FileInfo file, string html, IReadOnlyList<CardInput> cards, TextWriter output, TextWriter error, CancellationToken cancel)
    {
        try
        {
            ArchiveSupport.WriteText(file, html, cancel);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"launchlogger card: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (OperationCanceledException)
        {
            error.WriteLine("launchlogger card: stopped; nothing written");
            return ExitCode.Cancelled;
        }

        output.WriteLine($"wrote {cards.Count} card(s) to {file.FullName}; open it in a browser and print it from there (A4 or Letter)");
        return ExitCode.Ok;
    }
}
