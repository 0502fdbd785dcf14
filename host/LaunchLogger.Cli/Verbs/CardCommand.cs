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
        var units = new Option<DisplayUnits>("--units") { Description = "Units on the page: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
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

                return WritePage(file, [card.Run.Index], _ => card, RunCard.FootNote(card.ToolVersion), ExitCode.Ok, output, error, cancel);
            }, readOnly: true);
        }

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

            ExitCode judged = document.Runs.All(r => r.Verdict is null || r.Verdict.Level == "valid") ? ExitCode.Ok : ExitCode.Partial;
            return WriteCards(file, document, index, units, _ => [], judged, output, error, cancel);
        }

        // Each run's plots are drawn as it is analysed and spooled to a temporary file, then the run
        // is let go; the cards are written one at a time at the end, when the verdicts are final
        // (the session's braking bound is known only then), so a long log takes the memory of its
        // largest run, not of every run and its plots.
        using var spool = new PlotSpool();
        ReportCommand.Analysed? analysed = ReportCommand.Analyse(logs, "card", error, out ExitCode failed, cancel, (run, position) =>
        {
            if (index is null || index == position)
            {
                spool.Add(position, CardPlots.For(run, units));
            }
        });
        if (analysed is null)
        {
            return failed;
        }

        if (analysed.Document.Runs.Count == 0)
        {
            error.WriteLine("launchlogger card: no runs in the input (only bench rests: see launchlogger report)");
            return ExitCode.BadInput;
        }

        return WriteCards(file, analysed.Document, index, units, spool.Read, analysed.Code, output, error, cancel);
    }

    /// <summary>Writes the document's cards (or only card <paramref name="index"/>) to one page,
    /// card after card, each with the plots <paramref name="plotsOf"/> gives for its 1-based position.</summary>
    private static ExitCode WriteCards(FileInfo file, ReportDocument document, int? index, DisplayUnits units, Func<int, IReadOnlyList<PlotFigure>> plotsOf, ExitCode code, TextWriter output, TextWriter error, CancellationToken cancel)
    {
        IReadOnlyList<RunReport> runs = document.Runs;
        List<int> positions = Enumerable.Range(1, runs.Count).ToList();
        if (index is { } wanted)
        {
            if (wanted < 1 || wanted > runs.Count)
            {
                error.WriteLine($"launchlogger card: --index {wanted}: the input has runs 1 to {runs.Count}");
                return ExitCode.Usage;
            }

            positions = [wanted];
        }

        return WritePage(file, positions, position => Card(document, runs[position - 1], units, plotsOf(position)), RunCard.FootNote(ToolInfo.Version), code, output, error, cancel);
    }

    /// <summary>Writes the cards at <paramref name="positions"/> to one page, card after card
    /// (only one card's HTML is held at a time), all or nothing.</summary>
    private static ExitCode WritePage(FileInfo file, IReadOnlyList<int> positions, Func<int, CardInput> cardAt, string footNote, ExitCode code, TextWriter output, TextWriter error, CancellationToken cancel)
    {
        string title = positions.Count == 1 ? RunCard.Title(cardAt(positions[0])) : $"Run cards: {positions.Count} runs";
        try
        {
            AtomicFile.WriteAll([(file.FullName, stream =>
            {
                using var writer = new StreamWriter(stream, new UTF8Encoding(false), leaveOpen: true);
                writer.Write(HtmlPage.Head(title));
                var html = new StringBuilder(65536);
                foreach (int position in positions)
                {
                    cancel.ThrowIfCancellationRequested();
                    html.Clear();
                    RunCard.Append(html, cardAt(position));
                    writer.Write(html);
                }

                writer.Write(HtmlPage.Foot(footNote));
            })], cancel);
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

        output.WriteLine($"wrote {positions.Count} card(s) to {file.FullName}; open it in a browser and print it from there (A4 or Letter)");
        return code;
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
}
