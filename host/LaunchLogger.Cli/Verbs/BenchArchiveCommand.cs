using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench archive</c>: a season-sized archive made from simulated runs;
/// how fast the board answers and how fast logs import.</summary>
/// <remarks>Simulating and analysing 10,000 runs would take most of an hour on a small machine,
/// so the season is made from a few distinct simulated runs, each analysed once for real; every
/// filed copy has its own bytes (extra trailing frame delimiters, which readers skip) and its
/// figures scaled by a random factor of a few per cent, so the board has something to rank. The
/// import rate is measured separately on the full path — read, hash, decode, reconstruct,
/// judge, file — into that season archive (copies of one simulated run are recognised as that
/// run and filed once; they are read, decoded and judged all the same).</remarks>
public static class BenchArchiveCommand
{
    /// <summary>The goals the issue sets.</summary>
    public const double BoardGoalMs = 50, ImportGoalRunsPerS = 50;

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var runs = new Option<int>("--runs") { Description = "Runs in the season archive.", DefaultValueFactory = _ => 10_000 };
        var distinct = new Option<int>("--distinct") { Description = "Distinct simulated runs the season is made from.", DefaultValueFactory = _ => 6 };
        var importRuns = new Option<int>("--import-runs") { Description = "Logs imported on the full path to time the import rate.", DefaultValueFactory = _ => 200 };
        var seed = new Option<int>("--seed") { Description = "Seed for the simulation and the season's make-up.", DefaultValueFactory = _ => 1 };
        var folder = new Option<DirectoryInfo?>("--folder") { Description = "Where to build the archive (default: a temporary folder, removed after)." };
        var command = new Command("archive", "Season-sized archive: board query time (goal ≤ 50 ms) and import rate (goal ≥ 50 runs/s).") { runs, distinct, importRuns, seed, folder };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(parse.GetValue(runs), parse.GetValue(distinct), parse.GetValue(importRuns), parse.GetValue(seed),
            parse.GetValue(folder)?.FullName, parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel)));
        return command;
    }

    /// <summary>Runs the benchmark.</summary>
    public static ExitCode Run(int runs, int distinct, int importRuns, int seed, string? folder, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        if (runs is < 10 or > 1_000_000 || distinct is < 1 or > 100 || importRuns is < 1 or > 100_000)
        {
            error.WriteLine("launchlogger bench archive: --runs must be 10 to 1000000, --distinct 1 to 100, --import-runs 1 to 100000");
            return ExitCode.Usage;
        }

        bool temporary = folder is null;
        folder ??= Path.Combine(Path.GetTempPath(), "launchlogger-bench-archive-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        try
        {
            return Measure(runs, distinct, importRuns, seed, folder, output, error, cancel);
        }
        finally
        {
            if (temporary)
            {
                Directory.Delete(folder, recursive: true);
            }
        }
    }

    private static ExitCode Measure(int runs, int distinct, int importRuns, int seed, string folder, TextWriter output, TextWriter error, CancellationToken cancel)
    {
        CultureInfo inv = CultureInfo.InvariantCulture;
        output.WriteLine($"bench archive: {Load()}");
        var clock = Stopwatch.StartNew();
        error.WriteLine($"bench archive: simulating {distinct} distinct run(s)…");
        var scenarios = BuiltInScenarios.Scenarios.Where(s => s.Name != "brake-test-60").ToList();
        List<byte[]> logs = ParallelCases.Run(Enumerable.Range(0, distinct).ToList(), (i, c) => Simulator.Run(scenarios[i % scenarios.Count], seed + i, c).LogBytes, "simulate", TextWriter.Null, cancel);
        List<AnalysedLog> templates = ParallelCases.Run(logs, (l, c) => LogAnalyzer.Analyze(l, "template.log", ToolInfo.Version, cancel: c), "analyse", TextWriter.Null, cancel);
        double simulateS = clock.Elapsed.TotalSeconds;

        string path = Path.Combine(folder, "season.db");
        var random = new Random(seed);
        using (SessionArchive archive = SessionArchive.Open(path))
        {
            (List<string> events, List<string> drivers) = Register(archive, random);
            error.WriteLine($"bench archive: filing {runs:N0} runs…");
            clock.Restart();
            for (int i = 0; i < runs; i++)
            {
                cancel.ThrowIfCancellationRequested();
                AnalysedLog template = templates[i % templates.Count];
                byte[] bytes = [.. template.Bytes, .. new byte[1 + (i / templates.Count)]];
                double scale = 1 + (random.NextDouble() - 0.5) * 0.08;
                var log = template with
                {
                    Sha256 = LogAnalyzer.Hash(bytes),
                    Source = string.Create(inv, $"season-{i:00000}.log"),
                    Bytes = bytes,
                    // Each copy stands for another run of the season: its own fingerprint, or the
                    // archive would take it for the template run read from another copy.
                    Runs = template.Runs.Select(r => r with { Report = r.Report is { } rep ? Scale(rep, scale) : null, Fingerprint = string.Create(inv, $"season-{i}-{r.Position}") }).ToList(),
                };
                int driver = random.Next(drivers.Count);
                archive.File(log, archive.Resolve(new RunAssignment { Event = events[random.Next(events.Count)], Driver = drivers[driver], Car = $"car {driver:00}" }));
            }

            double fileS = clock.Elapsed.TotalSeconds;
            output.WriteLine(string.Create(inv, $"season archive: {runs:N0} runs from {distinct} distinct simulated runs ({simulateS:0.0} s to simulate and analyse), filed in {fileS:0.0} s ({runs / fileS:0} runs/s without analysis), {new FileInfo(path).Length / 1e6:0.0} MB"));

            // Board queries: every event × a spread of figures and both conventions, timed warm.
            var queries = new List<BoardRequest>();
            foreach (string e in events)
            {
                foreach ((string figure, Convention convention) in new[] { ("0-60mph", Convention.Standstill), ("quarter", Convention.Rollout), ("60ft", Convention.Rollout), ("trap", Convention.Standstill), ("stop", Convention.Standstill) })
                {
                    queries.Add(new BoardRequest { Figure = BoardFigures.Find(figure)!, Convention = convention, Filter = new RunFilter { Event = e } });
                }
            }

            queries.Add(new BoardRequest { Figure = BoardFigures.Find("0-60mph")!, Filter = new RunFilter { Season = 2026 } });
            queries.Add(new BoardRequest { Figure = BoardFigures.Find("0-60mph")!, Accept = Acceptance.All });
            archive.Board(queries[0]);
            var eventTimes = new List<double>();
            TimeSpan boardCpu = Process.GetCurrentProcess().TotalProcessorTime;
            foreach (BoardRequest q in queries.Take(queries.Count - 2))
            {
                eventTimes.Add(BestOfThreeMs(() => archive.Board(q)));
            }

            double boardCpuMs = (Process.GetCurrentProcess().TotalProcessorTime - boardCpu).TotalMilliseconds / (3.0 * eventTimes.Count);

            double seasonMs = BestOfThreeMs(() => archive.Board(queries[^2]));
            double everythingMs = BestOfThreeMs(() => archive.Board(queries[^1]));
            eventTimes.Sort();
            double median = Percentiles.Of([.. eventTimes], 0.5), worst = eventTimes[^1];
            output.WriteLine(string.Create(inv, $"board per event and class ({eventTimes.Count} queries, {runs / events.Count} runs per event, best of 3 each): median {median:0.0} ms, worst {worst:0.0} ms (goal ≤ {BoardGoalMs:0} ms); CPU {boardCpuMs:0.0} ms per query"));
            output.WriteLine(string.Create(inv, $"board over a whole season: {seasonMs:0.0} ms; over all {runs:N0} runs: {everythingMs:0.0} ms"));

            // Import on the full path into the season archive.
            string card = Directory.CreateDirectory(Path.Combine(folder, "card")).FullName;
            for (int i = 0; i < importRuns; i++)
            {
                File.WriteAllBytes(Path.Combine(card, string.Create(inv, $"new{i:00000}.log")), [.. logs[i % logs.Count], .. new byte[runs + i + 1]]);
            }

            archive.Dispose();
            TimeSpan cpuBefore = Process.GetCurrentProcess().TotalProcessorTime;
            clock.Restart();
            var quiet = new StringWriter();
            ExitCode imported = ImportCommand.Run(path, [card], RunAssignment.None, false, quiet, error, cancel);
            double importS = clock.Elapsed.TotalSeconds;
            double cpuS = (Process.GetCurrentProcess().TotalProcessorTime - cpuBefore).TotalSeconds;
            double rate = importRuns / importS;
            output.WriteLine(string.Create(inv, $"import (read, hash, decode, reconstruct, judge, file) of {importRuns} logs ({logs.Average(l => l.Length) / 1e3:0} kB each) into the season archive: {importS:0.00} s, {rate:0} runs/s on {Environment.ProcessorCount} core(s) (goal ≥ {ImportGoalRunsPerS:0} runs/s)"));
            output.WriteLine(string.Create(inv, $"  CPU time {cpuS:0.00} s: {importRuns / cpuS:0} runs per CPU-second; {Load()}"));
            bool met = imported == ExitCode.Ok && worst <= BoardGoalMs && rate >= ImportGoalRunsPerS;
            output.WriteLine(met ? "goals met" : "goals NOT met");
            return met ? ExitCode.Ok : ExitCode.CheckFailed;
        }
    }

    private static (List<string> Events, List<string> Drivers) Register(SessionArchive archive, Random random)
    {
        string[] classes = ["Street", "Modified", "Electric", "Classic"];
        foreach (string c in classes)
        {
            archive.AddRecord(RecordKind.Class, c, new Dictionary<string, string?>());
        }

        archive.AddRecord(RecordKind.Venue, "Marsh Lane strip", new Dictionary<string, string?>());
        var events = new List<string>();
        for (int season = 2025; season <= 2026; season++)
        {
            for (int round = 1; round <= 12; round++)
            {
                string name = string.Create(CultureInfo.InvariantCulture, $"{season} round {round}");
                archive.AddRecord(RecordKind.Event, name, new Dictionary<string, string?> { ["date"] = string.Create(CultureInfo.InvariantCulture, $"{season}-{round:00}-14"), ["venue"] = "Marsh Lane strip" });
                events.Add(name);
            }
        }

        var drivers = new List<string>();
        for (int d = 0; d < 80; d++)
        {
            string name = string.Create(CultureInfo.InvariantCulture, $"driver {d:00}");
            archive.AddRecord(RecordKind.Driver, name, new Dictionary<string, string?>());
            archive.AddRecord(RecordKind.Car, string.Create(CultureInfo.InvariantCulture, $"car {d:00}"), new Dictionary<string, string?> { ["class"] = classes[random.Next(classes.Length)] });
            drivers.Add(name);
        }

        return (events, drivers);
    }

    /// <summary>A report entry with every time scaled by <paramref name="k"/> (and speeds by 1/k), for variety only.</summary>
    private static RunReport Scale(RunReport r, double k) => r with
    {
        SpeedIntervals = r.SpeedIntervals.Select(i => i with { FromStandstillS = i.FromStandstillS * k, FromRolloutS = i.FromRolloutS * k }).ToList(),
        DistanceMarks = r.DistanceMarks.Select(m => m with { FromStandstillS = m.FromStandstillS * k, FromRolloutS = m.FromRolloutS * k, TrapSpeedMps = m.TrapSpeedMps / k }).ToList(),
        Braking = r.Braking is { } b ? b with { StoppingDistanceM = b.StoppingDistanceM * k } : null,
    };

    private static double BestOfThreeMs(Action action)
    {
        double best = double.MaxValue;
        for (int i = 0; i < 3; i++)
        {
            var clock = Stopwatch.StartNew();
            action();
            best = Math.Min(best, clock.Elapsed.TotalMilliseconds);
        }

        return best;
    }

    /// <summary>The machine's load, so a slow figure can be read against it (Linux only).</summary>
    private static string Load()
    {
        try
        {
            string[] parts = File.ReadAllText("/proc/loadavg").Split(' ');
            return $"load average {parts[0]} over the last minute on {Environment.ProcessorCount} core(s)";
        }
        catch (IOException)
        {
            return "load average unknown";
        }
        catch (UnauthorizedAccessException)
        {
            return "load average unknown";
        }
    }
}
