using System.CommandLine;
using LaunchLogger.Archive.Board;
using LaunchLogger.Cli.Output;
using LaunchLogger.Pages;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger results</c>: an event's results from the archive as one
/// self-contained HTML file: the event, its board per class, every run's card.</summary>
public static class ResultsCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var eventName = new Option<string>("--event") { Description = "The event.", Required = true };
        var figure = new Option<string>("--figure") { Description = $"Figure the board ranks by: {BoardFigures.Codes}.", DefaultValueFactory = _ => "0-60mph" };
        var from = new Option<string>("--from") { Description = "standstill or rollout.", DefaultValueFactory = _ => "standstill" };
        var accept = new Option<string>("--accept") { Description = "Verdicts that count on the board: valid, doubtful or all.", DefaultValueFactory = _ => "valid" };
        var units = new Option<DisplayUnits>("--units") { Description = "Units on the page: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var file = new Option<FileInfo>("--out") { Description = "The HTML file to write.", Required = true };
        var archive = ArchiveSupport.ArchiveOption();
        var command = new Command("results", "Write an event's results as one HTML file (print it from a browser): the board per class, then every run's card.")
        {
            eventName, figure, from, accept, units, file, archive,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            parse.GetValue(archive)?.FullName,
            parse.GetValue(eventName)!,
            parse.GetValue(figure)!,
            parse.GetValue(from)!,
            parse.GetValue(accept)!,
            parse.GetValue(units),
            parse.GetValue(file)!,
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(string? archivePath, string eventName, string figure, string from, string accept, DisplayUnits units, FileInfo file, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        BoardRequest request;
        try
        {
            request = BoardRequest.Parse(figure, from, accept);
        }
        catch (FormatException e)
        {
            error.WriteLine($"launchlogger results: {e.Message}");
            return ExitCode.Usage;
        }

        return ArchiveSupport.With(archivePath, "results", error, archive =>
        {
            string html = EventSheet.Page(archive, eventName, request, units, ToolInfo.Version, cancel);
            ArchiveSupport.WriteText(file, html, cancel);
            output.WriteLine($"wrote the results of {eventName} to {file.FullName}; open it in a browser and print it from there (A4 or Letter)");
            return ExitCode.Ok;
        }, readOnly: true);
    }
}
