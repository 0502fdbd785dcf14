using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger import PATH…</c>: files logs from an SD card or a folder into the
/// archive, skipping any whose bytes are there already, and says what was new.</summary>
public static class ImportCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var paths = new Argument<string[]>("path") { Description = "Log files, or folders searched for *.log files (an SD card's mount point, a download folder).", Arity = ArgumentArity.OneOrMore };
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var assignment = new RunAssignmentOptions();
        var command = new Command("import", "File logs into the archive; logs already there (same bytes) are skipped.") { paths, archive, json };
        assignment.AddTo(command);
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            parse.GetValue(archive)?.FullName, parse.GetValue(paths) ?? [], assignment.Read(parse), parse.GetValue(json),
            parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    /// <param name="archivePath">The archive (null: the default).</param>
    /// <param name="paths">Files and folders.</param>
    /// <param name="assignment">Where the new runs belong.</param>
    /// <param name="json">True for a JSON summary.</param>
    /// <param name="output">What was filed.</param>
    /// <param name="error">One-line problems.</param>
    /// <param name="cancel">Stops between logs; what is filed stays filed.</param>
    public static ExitCode Run(string? archivePath, IReadOnlyList<string> paths, RunAssignment assignment, bool json, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        List<string> files;
        try
        {
            files = FindLogs(paths);
        }
        catch (UsageException e)
        {
            error.WriteLine($"launchlogger import: {e.Message}");
            return ExitCode.BadInput;
        }

        return ArchiveSupport.With(archivePath, "import", error, archive =>
        {
            ResolvedAssignment resolved = archive.Resolve(assignment);
            var outcomes = new List<ImportOutcome>();
            var problems = new List<string>();

            // Hash first (reading each file in blocks), so logs already filed are not analysed
            // again; analyse the rest on every core, each read one run at a time, and file them
            // one by one, in order, each in its own transaction, its bytes copied from its file.
            // No log is ever held whole, so memory is bounded by the largest runs being analysed.
            var work = files
                .Select(f => (File: f, Hash: TryHash(f, problems)))
                .Where(w => w.Hash is not null)
                .Select(w => (w.File, Hash: w.Hash!))
                .ToList();
            var skipped = work.Where(w => archive.FindLog(w.Hash) is not null).ToList();
            foreach (var s in skipped)
            {
                outcomes.Add(new ImportOutcome(s.File, archive.FindLog(s.Hash)!.Value, false, []));
            }

            var analysed = work.Except(skipped)
                .DistinctBy(w => w.Hash)
                .AsParallel().AsOrdered().WithCancellation(cancel)
                .Select(w => TryAnalyse(w.File, w.Hash, resolved, cancel));
            foreach ((AnalysedLog? log, string? problem) in analysed)
            {
                if (log is null)
                {
                    problems.Add(problem!);
                    continue;
                }

                try
                {
                    outcomes.Add(archive.File(log, resolved));
                }
                catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArchiveException)
                {
                    problems.Add($"{log.BytesFile}: not filed: {e.Message}");
                }
            }

            Report(outcomes, problems, json, output, error);
            return problems.Count == 0 ? ExitCode.Ok : outcomes.Count > 0 ? ExitCode.Partial : ExitCode.BadInput;
        });
    }

    /// <summary>The log files named by <paramref name="paths"/>: files as given, folders searched
    /// (with their subfolders) for *.log in any letter case, in name order.</summary>
    /// <exception cref="UsageException">A path does not exist.</exception>
    public static List<string> FindLogs(IEnumerable<string> paths)
    {
        var files = new List<string>();
        foreach (string path in paths)
        {
            if (File.Exists(path))
            {
                files.Add(Path.GetFullPath(path));
            }
            else if (Directory.Exists(path))
            {
                files.AddRange(Directory.EnumerateFiles(path, "*", new EnumerationOptions { RecurseSubdirectories = true, IgnoreInaccessible = true })
                    .Where(f => f.EndsWith(".log", StringComparison.OrdinalIgnoreCase))
                    .Order(StringComparer.Ordinal));
            }
            else
            {
                throw new UsageException($"{path}: no such file or folder");
            }
        }

        return files;
    }

    private static string? TryHash(string file, List<string> problems)
    {
        try
        {
            return LogAnalyzer.HashFile(file);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            problems.Add($"{file}: cannot read: {e.Message}");
            return null;
        }
    }

    private static (AnalysedLog? Log, string? Problem) TryAnalyse(string file, string hash, ResolvedAssignment resolved, CancellationToken cancel)
    {
        try
        {
            AnalysedLog log = LogAnalyzer.AnalyzeFile(file, hash, Path.GetFileName(file), ToolInfo.Version, resolved.Calibration, resolved.Weather, cancel);
            return NotALog(log) is { } why ? (null, $"{file}: not filed: no runs in it ({why})") : (log, null);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return (null, $"{file}: cannot read: {e.Message}");
        }
    }

    /// <summary>Why <paramref name="log"/> is not a log to file, or null: a file without runs that
    /// is empty, or whose reading found damage (a text file, a photo, a file cut short), is not
    /// filed as a "new log with 0 runs". A clean log without runs (a power-up that only holds bench
    /// rests) is filed as before: its bytes are the box's.</summary>
    private static string? NotALog(AnalysedLog log)
    {
        if (log.Runs.Count > 0)
        {
            return null;
        }

        if (log.ByteCount == 0)
        {
            return "the file is empty";
        }

        return log.Warnings.Count > 0 ? string.Join("; ", log.Warnings) : null;
    }

    private static void Report(List<ImportOutcome> outcomes, List<string> problems, bool json, TextWriter output, TextWriter error)
    {
        foreach (string problem in problems)
        {
            error.WriteLine($"launchlogger import: {problem}");
        }

        int newLogs = outcomes.Count(o => o.IsNew);
        int runs = outcomes.Sum(o => o.Runs.Count);
        if (json)
        {
            output.WriteLine(JsonSerializer.Serialize(new
            {
                NewLogs = newLogs,
                AlreadyFiled = outcomes.Count - newLogs,
                Runs = outcomes.SelectMany(o => o.Runs.Select(r => new
                {
                    Log = o.Source,
                    Run = r.RunId,
                    r.Run.BoxRun,
                    r.Run.Verdict,
                    r.Run.Failure,
                })),
                KnownRuns = outcomes.SelectMany(o => o.Known.Select(k => new
                {
                    Log = o.Source,
                    Run = k.RunId,
                    k.Run.BoxRun,
                    k.Run.FramesLost,
                    k.TookOver,
                })),
                Skipped = outcomes.Where(o => !o.IsNew).Select(o => o.Source),
                Problems = problems,
            }, ArchiveTableWriter.JsonOptions));
            return;
        }

        foreach (ImportOutcome o in outcomes)
        {
            if (!o.IsNew)
            {
                output.WriteLine($"already filed  {o.Source}");
                continue;
            }

            output.WriteLine($"new            {o.Source}: {o.Runs.Count} run(s)");
            foreach ((long runId, AnalysedRun run) in o.Runs)
            {
                output.WriteLine($"  run {runId,-6} box run {run.BoxRun,-3} {run.Verdict}{(run.Failure is { } f ? ": " + f : "")}");
            }

            foreach (KnownRun known in o.Known)
            {
                output.WriteLine(known.TookOver
                    ? $"  run {known.RunId,-6} box run {known.Run.BoxRun,-3} filed before from a copy that lost frames; this copy now carries it ({known.Run.Verdict})"
                    : $"  run {known.RunId,-6} box run {known.Run.BoxRun,-3} filed before from another copy; kept as it was");
            }
        }

        output.WriteLine($"{newLogs} new log(s), {runs} run(s) filed; {outcomes.Count - newLogs} already in the archive");
    }
}
