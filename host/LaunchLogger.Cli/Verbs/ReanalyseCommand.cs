using System.CommandLine;
using LaunchLogger.Archive.Importing;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger reanalyse</c>: reads the stored raw logs again with this version of
/// the tool, so an upgrade's better reconstruction reaches every run already filed.</summary>
public static class ReanalyseCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var all = new Option<bool>("--all") { Description = "Every run, not only those last analysed by another tool version." };
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var command = new Command("reanalyse", "Analyse stored runs again with this tool version; earlier results stay in each run's history.") { all, archive, json };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(parse.GetValue(archive)?.FullName, parse.GetValue(all), parse.GetValue(json), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(string? archivePath, bool all, bool json, TextWriter output, TextWriter error, CancellationToken cancel = default) =>
        ArchiveSupport.With(archivePath, "reanalyse", error, archive =>
        {
            ReanalysisOutcome outcome = archive.Reanalyse(ToolInfo.Version, all, cancel: cancel);
            output.WriteLine(json
                ? System.Text.Json.JsonSerializer.Serialize(outcome, Output.ArchiveTableWriter.JsonOptions)
                : $"re-analysed {outcome.Runs} run(s) from {outcome.Logs} log(s) with launchlogger {ToolInfo.Version}; {outcome.VerdictsChanged} verdict(s) changed");
            return ExitCode.Ok;
        });
}
