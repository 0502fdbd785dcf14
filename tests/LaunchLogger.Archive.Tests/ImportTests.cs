using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Archive.Tests.Support;
using LaunchLogger.Cli;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Simulation.Box;

namespace LaunchLogger.Archive.Tests;

public class ImportTests
{
    [Fact]
    public void A_file_that_is_not_a_log_is_refused_by_name_and_not_filed()
    {
        // A new user's slip: a text file and an empty file named on the command line beside a
        // real log. Before, both were filed as "new … 0 run(s)" with exit 0; they are not logs.
        using var temp = new TempFolder();
        string text = temp.File("notes.log");
        File.WriteAllText(text, "hello world\n");
        string empty = temp.File("empty.log");
        File.WriteAllBytes(empty, []);
        string real = temp.File("run.log");
        File.WriteAllBytes(real, TestLogs.Hatch);
        string archive = temp.File("a.db");

        var output = new StringWriter();
        var error = new StringWriter();
        Assert.Equal(ExitCode.Partial, ImportCommand.Run(archive, [text, empty, real], RunAssignment.None, false, output, error));
        Assert.Contains("notes.log: not filed: no runs in it", error.ToString());
        Assert.Contains("not a log", error.ToString());
        Assert.Contains("empty.log: not filed: no runs in it (the file is empty)", error.ToString());
        Assert.Contains("1 new log(s), 1 run(s) filed", output.ToString());

        var alone = new StringWriter();
        Assert.Equal(ExitCode.BadInput, ImportCommand.Run(archive, [text], RunAssignment.None, false, new StringWriter(), alone));
        Assert.Contains("notes.log: not filed", alone.ToString());

        using SessionArchive opened = SessionArchive.Open(archive);
        Assert.Single(opened.ListRuns().Rows);
        Assert.Null(opened.FindLog(LogAnalyzer.HashFile(text)));
    }

    [Fact]
    public void Importing_the_same_logs_twice_adds_nothing_the_second_time()
    {
        using var temp = new TempFolder();
        string card = Directory.CreateDirectory(temp.File("card")).FullName;
        File.WriteAllBytes(Path.Combine(card, "RUN001.LOG"), TestLogs.Hatch);
        File.WriteAllBytes(Path.Combine(card, "run002.log"), TestLogs.Roadster);
        File.WriteAllText(Path.Combine(card, "notes.txt"), "not a log");
        string archive = temp.File("a.db");

        var first = new StringWriter();
        Assert.Equal(ExitCode.Ok, ImportCommand.Run(archive, [card], RunAssignment.None, false, first, new StringWriter()));
        Assert.Contains("2 new log(s), 2 run(s) filed", first.ToString());

        var second = new StringWriter();
        Assert.Equal(ExitCode.Ok, ImportCommand.Run(archive, [card, Path.Combine(card, "run002.log")], RunAssignment.None, false, second, new StringWriter()));
        Assert.Contains("0 new log(s), 0 run(s) filed; 3 already in the archive", second.ToString());

        using SessionArchive opened = SessionArchive.Open(archive);
        Assert.Equal(2, opened.ListRuns().Rows.Count);
        Assert.Equal(TestLogs.Hatch, opened.LogBytes(1));

        // The stored log read as a stream, a block at a time, is the same bytes; a log that is
        // not there is the archive's error, not the database's.
        using (Stream stream = opened.OpenLog(1))
        {
            var copy = new MemoryStream();
            byte[] block = new byte[1000];
            for (int got; (got = stream.Read(block, 0, block.Length)) > 0;)
            {
                copy.Write(block, 0, got);
            }

            Assert.Equal(TestLogs.Hatch, copy.ToArray());
        }

        Assert.Throws<ArchiveException>(() => opened.OpenLog(99));
    }

    /// <summary>A bench rest is no run: a card's log holding a run and then a rest files the run
    /// alone, with its figures as from the log without the rest.</summary>
    [Fact]
    public void A_bench_rest_in_a_log_is_not_filed_as_a_run()
    {
        using var temp = new TempFolder();
        string card = Directory.CreateDirectory(temp.File("card")).FullName;
        File.WriteAllBytes(Path.Combine(card, "RUN001.LOG"), [.. TestLogs.Hatch, .. BenchRestLogs.Write(31, new BenchRestLogs.Rest(9.8))]);
        string plain = Path.Combine(Directory.CreateDirectory(temp.File("plain")).FullName, "RUN001.LOG");
        File.WriteAllBytes(plain, TestLogs.Hatch);
        string archive = temp.File("a.db");
        var output = new StringWriter();

        Assert.Equal(ExitCode.Ok, ImportCommand.Run(archive, [card], RunAssignment.None, false, output, new StringWriter()));

        Assert.Contains("1 new log(s), 1 run(s) filed", output.ToString());
        var json = new StringWriter();
        Assert.Equal(ExitCode.Ok, ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(plain)], Json = true }, json, new StringWriter()));
        RunReport expected = ReportJson.Deserialize(json.ToString())!.Runs.Single();
        using SessionArchive opened = SessionArchive.Open(archive);
        Assert.Single(opened.ListRuns().Rows);
        (_, string? stored) = opened.ShowRun(1);
        RunReport filed = System.Text.Json.JsonSerializer.Deserialize<RunReport>(stored!, ReportJson.Options)!;
        Assert.Equal(ReportJson.Serialize(Wrap(expected)), ReportJson.Serialize(Wrap(filed)));
    }

    [Fact]
    public void Stored_figures_are_the_report_documents_own()
    {
        using var temp = new TempFolder();
        string log = temp.File("hatch.log");
        File.WriteAllBytes(log, TestLogs.Hatch);
        var json = new StringWriter();
        Assert.Equal(ExitCode.Ok, ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true }, json, new StringWriter()));
        RunReport expected = ReportJson.Deserialize(json.ToString())!.Runs.Single();

        string archive = temp.File("a.db");
        Assert.Equal(ExitCode.Ok, ImportCommand.Run(archive, [log], RunAssignment.None, false, new StringWriter(), new StringWriter()));
        using SessionArchive opened = SessionArchive.Open(archive);
        (_, string? stored) = opened.ShowRun(1);
        RunReport filed = System.Text.Json.JsonSerializer.Deserialize<RunReport>(stored!, ReportJson.Options)!;
        Assert.Equal(ReportJson.Serialize(Wrap(expected)), ReportJson.Serialize(Wrap(filed)));

        foreach (Convention convention in new[] { Convention.Standstill, Convention.Rollout })
        {
            foreach (BoardFigure figure in BoardFigures.All)
            {
                FigureValue? value = figure.Read(expected);
                BoardResult board = opened.Board(new BoardRequest { Figure = figure, Convention = convention, Accept = Acceptance.All });
                if (value is null)
                {
                    Assert.Empty(board.Sections);
                    continue;
                }

                double want = (convention == Convention.Rollout && figure.HasConventions ? value.Rollout : value.Standstill)!.Value;
                Assert.Equal(want, board.Sections.Single().Rows.Single().Value);
            }
        }
    }

    [Fact]
    public void The_quarter_mile_row_reads_the_1320_ft_mark_and_its_trap()
    {
        // 1320 ft = 402.336 m exactly (1 ft = 0.3048 m, international yard and pound agreement, 1959).
        RunReport report = TestLogs.HatchAnalysed.Runs[0].Report! with
        {
            DistanceMarks =
            [
                new DistanceMarkReport { Label = "x", DistanceM = 402.336, FromStandstillS = 13.5, FromRolloutS = 13.1, TrapSpeedMps = 45.0 },
                new DistanceMarkReport { Label = "y", DistanceM = 18.288, FromStandstillS = 2.2, FromRolloutS = 1.8 },
            ],
        };
        Assert.Equal(13.5, BoardFigures.Find("quarter")!.Read(report)!.Standstill);
        Assert.Equal(13.1, BoardFigures.Find("quarter")!.Read(report)!.Rollout);
        Assert.Equal(45.0, BoardFigures.Find("trap")!.Read(report)!.Standstill);
        Assert.Equal(1.8, BoardFigures.Find("60ft")!.Read(report)!.Rollout);
        Assert.Null(BoardFigures.Find("eighth")!.Read(report));
    }

    [Fact]
    public void Reanalysis_gives_every_stored_run_a_result_from_this_version_and_keeps_the_old_one()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        archive.File(LogAnalyzer.Analyze(TestLogs.Hatch, "hatch.log", "0.0.1-old"));
        archive.File(LogAnalyzer.Analyze(TestLogs.Roadster, "roadster.log", "0.0.1-old"));

        ReanalysisOutcome outcome = archive.Reanalyse("0.2.0", everything: false);
        Assert.Equal(2, outcome.Logs);
        Assert.Equal(2, outcome.Runs);
        Assert.All(archive.ListRuns().AsObjects(), r => Assert.Equal("0.2.0", r["tool_version"]));
        Assert.Equal(2, archive.RunHistory(1).Rows.Count);

        // Nothing left from another version: a second pass has nothing to do.
        Assert.Equal(0, archive.Reanalyse("0.2.0", everything: false).Logs);
    }

    [Fact]
    public void Runs_can_be_assigned_and_an_unknown_name_is_one_clear_error()
    {
        using var temp = new TempFolder();
        string archive = temp.File("a.db");
        string log = temp.File("hatch.log");
        File.WriteAllBytes(log, TestLogs.Hatch);
        var error = new StringWriter();
        Assert.Equal(ExitCode.BadInput, ImportCommand.Run(archive, [log], new RunAssignment { Driver = "Nobody" }, false, new StringWriter(), error));
        Assert.Equal("launchlogger import: no driver named 'Nobody' (add it with `driver add`)", error.ToString().Trim());

        using (SessionArchive a = SessionArchive.Open(archive))
        {
            a.AddRecord(RecordKind.Driver, "Robin Vale", new Dictionary<string, string?>());
            a.AddRecord(RecordKind.Class, "Street", new Dictionary<string, string?>());
            a.AddRecord(RecordKind.Car, "Blue hatch", new Dictionary<string, string?> { ["class"] = "Street" });
        }

        Assert.Equal(ExitCode.Ok, ImportCommand.Run(archive, [log], new RunAssignment { Driver = "Robin Vale", Car = "Blue hatch" }, false, new StringWriter(), new StringWriter()));
        using SessionArchive b = SessionArchive.Open(archive);
        var run = b.ListRuns(new RunFilter { Class = "Street" }).AsObjects().Single();
        Assert.Equal("Robin Vale", run["driver"]);
        Assert.Equal("Street", run["class"]);
    }

    private static ReportDocument Wrap(RunReport run) => new() { ToolVersion = "x", Source = "x", Runs = [run with { Source = "", Index = 1 }] };
}
