using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Board;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger board</c>: runs ranked by one figure, per class, each driver's best
/// valid run; reruns and disqualifications listed apart with their reasons.</summary>
public static class BoardCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var figure = new Option<string>("--figure") { Description = $"Figure to rank by: {BoardFigures.Codes}.", DefaultValueFactory = _ => "0-60mph" };
        var from = new Option<string>("--from") { Description = "Standing-start figures timed from standstill or after the rollout: standstill or rollout.", DefaultValueFactory = _ => "standstill" };
        var accept = new Option<string>("--accept") { Description = "Verdicts that count: valid, doubtful (valid and doubtful) or all.", DefaultValueFactory = _ => "valid" };
        var everyRun = new Option<bool>("--every-run") { Description = "List every eligible run, not only each driver's best." };
        var units = new Option<DisplayUnits>("--units") { Description = "Units for the text table: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var json = new Option<bool>("--json") { Description = "Write the board as JSON (SI units)." };
        var csv = new Option<bool>("--csv") { Description = "Write the board as CSV (SI units)." };
        var file = new Option<FileInfo?>("--out") { Description = "Write to this file instead of standard output." };
        var archive = ArchiveSupport.ArchiveOption();
        var filter = new RunFilterOptions();
        var command = new Command("board", "Rank runs by a figure per class: each driver's best valid run, ties broken by a fixed rule, reruns and disqualifications listed apart.")
        {
            figure, from, accept, everyRun, units, json, csv, file, archive,
        };
        filter.AddTo(command);
        command.SetAction((parse, _) => Task.FromResult((int)Run(
            parse.GetValue(archive)?.FullName,
            parse.GetValue(figure)!,
            parse.GetValue(from)!,
            parse.GetValue(accept)!,
            filter.Read(parse),
            parse.GetValue(everyRun),
            parse.GetValue(units),
            parse.GetValue(json) ? "json" : parse.GetValue(csv) ? "csv" : "text",
            parse.GetValue(file),
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(string? archivePath, string figure, string from, string accept, LaunchLogger.Archive.Records.RunFilter filter, bool everyRun,
        DisplayUnits units, string format, FileInfo? file, TextWriter output, TextWriter error)
    {
        BoardRequest request;
        try
        {
            request = BoardRequest.Parse(figure, from, accept, filter, everyRun);
        }
        catch (FormatException e)
        {
            error.WriteLine($"launchlogger board: {e.Message}");
            return ExitCode.Usage;
        }

        return ArchiveSupport.With(archivePath, "board", error, archive =>
        {
            BoardResult board = archive.Board(request);
            Action<TextWriter> write = format switch
            {
                "json" => w => w.WriteLine(JsonSerializer.Serialize(board, ArchiveTableWriter.JsonOptions)),
                "csv" => w => ArchiveTableWriter.WriteCsv(Table(board), w),
                _ => w => WriteText(board, units, w),
            };
            if (file is null)
            {
                write(output);
            }
            else
            {
                AtomicFile.WriteAll([(file.FullName, stream =>
                {
                    using var writer = new StreamWriter(stream, new System.Text.UTF8Encoding(false), leaveOpen: true);
                    write(writer);
                })]);
                output.WriteLine($"wrote the board to {file.FullName}");
            }

            return ExitCode.Ok;
        });
    }

    /// <summary>The board as rows (one per ranked run, then the runs not counted), SI units.</summary>
    public static ArchiveTable Table(BoardResult board)
    {
        ArgumentNullException.ThrowIfNull(board);
        string unit = board.Unit switch { "m/s" => "mps", "m" => "m", _ => "s" };
        var table = new ArchiveTable(["class", "rank", "driver", "car", "event", "run", "box_run", $"{board.Figure}_{unit}", $"uncertainty_{unit}", "convention", "verdict", "reasons", "runs", "standing", "standing_reason"]);
        foreach (BoardSection section in board.Sections)
        {
            foreach (BoardRow r in section.Rows)
            {
                table.Rows.Add([section.Class, r.Rank, r.Driver, r.Car, r.Event, r.Run, r.BoxRun, r.Value, r.Uncertainty, board.Convention, r.Verdict, r.Reasons, r.Runs, r.Standing, r.StandingReason]);
            }
        }

        foreach (BoardRow r in board.NotCounted)
        {
            table.Rows.Add([r.Class, null, r.Driver, r.Car, r.Event, r.Run, r.BoxRun, r.Value, r.Uncertainty, board.Convention, r.Verdict, r.Reasons, null, r.Standing, r.StandingReason]);
        }

        return table;
    }

    private static void WriteText(BoardResult board, DisplayUnits units, TextWriter output)
    {
        string convention = board.Convention switch { "standstill" => ", timed from standstill", "rollout" => ", timed after the rollout", _ => "" };
        string who = board.BestPerDriver ? "best run per driver" : "every run";
        output.WriteLine($"{board.Description}{convention}; {who}; verdicts accepted: {board.Accept}");
        if (board.Sections.Count == 0)
        {
            output.WriteLine("(no runs with this figure)");
        }

        foreach (BoardSection section in board.Sections)
        {
            output.WriteLine();
            output.WriteLine($"class {section.Class ?? "(none)"}");
            var table = new ArchiveTable(["#", "driver", "car", board.Description, "±", "verdict", "runs", "run"]);
            foreach (BoardRow r in section.Rows)
            {
                table.Rows.Add([r.Rank, r.Driver ?? "—", r.Car ?? "—", Format.BoardValue(board.Unit, r.Value, units), Format.BoardValue(board.Unit, r.Uncertainty, units, sigma: true), r.Verdict, r.Runs, r.Run]);
            }

            ArchiveTableWriter.WriteText(table, output);
        }

        if (board.NotCounted.Count > 0)
        {
            output.WriteLine();
            output.WriteLine("not counted:");
            foreach (BoardRow r in board.NotCounted)
            {
                output.WriteLine($"  run {r.Run} ({r.Driver ?? r.Car ?? "unassigned"}, {Format.BoardValue(board.Unit, r.Value, units)}): {r.Standing}: {r.StandingReason}");
            }
        }

        if (board.LeftOutForVerdict > 0)
        {
            output.WriteLine();
            output.WriteLine($"{board.LeftOutForVerdict} run(s) with this figure left out for their verdict (--accept doubtful or all to include them)");
        }

        output.WriteLine();
        output.WriteLine($"ties: {board.Ties}");
    }
}
