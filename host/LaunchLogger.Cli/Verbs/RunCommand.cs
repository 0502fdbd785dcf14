using System.CommandLine;
using System.Text.Json;
using System.Text.Json.Nodes;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger run list|show|edit|export</c>: the archive's runs.</summary>
public static class RunCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create() => new("run", "Runs in the archive: list, show, assign to an event, car, driver and class, mark reruns and disqualifications, export.")
    {
        ListVerb(),
        ShowVerb(),
        EditVerb(),
        ExportVerb(),
    };

    /// <summary>Lists runs with their main figures (SI: s, m/s, m).</summary>
    public static ExitCode List(string? archivePath, RunFilter filter, bool json, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, "run list", error, archive =>
        {
            ArchiveSupport.Write(archive.ListRuns(filter), json, output);
            return ExitCode.Ok;
        });

    /// <summary>Shows one run: where it belongs, its verdict and figures, its result history.</summary>
    public static ExitCode Show(string? archivePath, long runId, bool json, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, "run show", error, archive =>
        {
            (ArchiveTable row, string? report) = archive.ShowRun(runId);
            ArchiveTable history = archive.RunHistory(runId);
            if (json)
            {
                var body = new JsonObject
                {
                    ["run"] = JsonSerializer.SerializeToNode(row.AsObjects().First(), ArchiveTableWriter.JsonOptions),
                    ["report"] = report is null ? null : JsonNode.Parse(report),
                    ["history"] = JsonSerializer.SerializeToNode(history.AsObjects(), ArchiveTableWriter.JsonOptions),
                };
                output.WriteLine(body.ToJsonString(ArchiveTableWriter.JsonOptions));
                return ExitCode.Ok;
            }

            ArchiveTableWriter.WriteRecord(row, output);
            output.WriteLine();
            output.WriteLine("results (newest is current):");
            ArchiveTableWriter.WriteText(history, output);
            return ExitCode.Ok;
        });

    /// <summary>Changes where a run belongs and whether it counts.</summary>
    public static ExitCode Edit(string? archivePath, long runId, RunAssignment assignment, string? standing, string? reason, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, "run edit", error, archive =>
        {
            bool any = assignment.Event is not null || assignment.Car is not null || assignment.Driver is not null || assignment.Class is not null;
            if (!any && standing is null)
            {
                throw new UsageException("nothing to change: give --event, --car, --driver, --class or --standing");
            }

            RunStanding? parsed = standing is null ? null : standing.ToLowerInvariant() switch
            {
                "counted" => RunStanding.Counted,
                "rerun" => RunStanding.Rerun,
                "disqualified" => RunStanding.Disqualified,
                _ => throw new UsageException($"--standing {standing}: give counted, rerun or disqualified"),
            };
            if (any && archive.AssignRun(runId, assignment))
            {
                output.WriteLine($"run {runId}: the car changed; `launchlogger reanalyse --all` applies its settings to the figures");
            }
            else if (assignment.Event is not null)
            {
                output.WriteLine($"run {runId}: the event changed; `launchlogger reanalyse --all` applies its weather to the figures");
            }

            if (parsed is { } s)
            {
                archive.SetStanding(runId, s, reason);
            }

            output.WriteLine($"changed run {runId}");
            return ExitCode.Ok;
        });

    /// <summary>Exports runs with their main figures as CSV or JSON.</summary>
    public static ExitCode Export(string? archivePath, RunFilter filter, string format, FileInfo? file, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, "run export", error, archive =>
        {
            ArchiveSupport.Export(archive.ListRuns(filter), format, file, output);
            return ExitCode.Ok;
        });

    private static Command ListVerb()
    {
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var filter = new RunFilterOptions();
        var command = new Command("list", "List runs with their main figures (s, m/s, m).") { archive, json };
        filter.AddTo(command);
        command.SetAction((parse, _) => Task.FromResult((int)List(parse.GetValue(archive)?.FullName, filter.Read(parse), parse.GetValue(json), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }

    private static Command ShowVerb()
    {
        var id = new Argument<long>("run") { Description = "The run's archive number (from `run list`)." };
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var command = new Command("show", "Show one run; --json includes its full report entry.") { id, archive, json };
        command.SetAction((parse, _) => Task.FromResult((int)Show(parse.GetValue(archive)?.FullName, parse.GetValue(id), parse.GetValue(json), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }

    private static Command EditVerb()
    {
        var id = new Argument<long>("run") { Description = "The run's archive number." };
        var archive = ArchiveSupport.ArchiveOption();
        var assignment = new RunAssignmentOptions();
        var standing = new Option<string?>("--standing") { Description = "counted, rerun (void; a rerun was granted) or disqualified." };
        var reason = new Option<string?>("--reason") { Description = "Why (required for a rerun or a disqualification)." };
        var command = new Command("edit", "Assign a run (an empty name clears) or record a rerun or disqualification with its reason.") { id, archive, standing, reason };
        assignment.AddTo(command);
        command.SetAction((parse, _) => Task.FromResult((int)Edit(parse.GetValue(archive)?.FullName, parse.GetValue(id), assignment.Read(parse), parse.GetValue(standing), parse.GetValue(reason), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }

    private static Command ExportVerb()
    {
        var archive = ArchiveSupport.ArchiveOption();
        var format = ArchiveSupport.FormatOption();
        var file = ArchiveSupport.ExportFileOption();
        var filter = new RunFilterOptions();
        var command = new Command("export", "Export runs with their main figures as CSV or JSON.") { archive, format, file };
        filter.AddTo(command);
        command.SetAction((parse, _) => Task.FromResult((int)Export(parse.GetValue(archive)?.FullName, filter.Read(parse), parse.GetValue(format)!, parse.GetValue(file), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }
}
