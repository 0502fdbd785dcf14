using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Archive.Tests.Support;

namespace LaunchLogger.Archive.Tests;

/// <summary>One run, two copies of the box's bytes: the live capture over a link that dropped a
/// frame, and the card read after the session. The archive keeps one run, carried by the
/// fuller copy; and each run is analysed again with its own event and car.</summary>
public class RunCopyTests
{
    [Fact]
    public void The_card_copy_takes_over_a_run_the_live_capture_filed_with_a_frame_missing()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        byte[] live = WithoutOneFrame(TestLogs.Hatch);

        AnalysedLog liveLog = LogAnalyzer.Analyze(live, "capture.log", "test");
        Assert.True(liveLog.Runs.Single().FramesLost > 0);
        ImportOutcome first = archive.File(liveLog);
        long runId = first.Runs.Single().RunId;

        ImportOutcome card = archive.File(LogAnalyzer.Analyze(TestLogs.Hatch, "RUN001.LOG", "test"));

        Assert.True(card.IsNew);
        Assert.Empty(card.Runs);
        KnownRun known = Assert.Single(card.Known);
        Assert.Equal(runId, known.RunId);
        Assert.True(known.TookOver);
        Assert.Single(archive.ListRuns().Rows);
        Assert.Equal(2, archive.RunHistory(runId).Rows.Count);
        ArchiveTable row = archive.ShowRun(runId).Row;
        long logId = Convert.ToInt64(row.Rows.Single()[row.Columns.ToList().IndexOf("log")]);
        Assert.Equal(card.LogId, logId);
        Assert.Equal(TestLogs.Hatch, archive.LogBytes(logId));
    }

    [Fact]
    public void A_copy_that_lost_frames_never_replaces_the_full_one()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        long runId = archive.File(LogAnalyzer.Analyze(TestLogs.Hatch, "RUN001.LOG", "test")).Runs.Single().RunId;

        ImportOutcome later = archive.File(LogAnalyzer.Analyze(WithoutOneFrame(TestLogs.Hatch), "capture.log", "test"));

        Assert.Empty(later.Runs);
        Assert.False(Assert.Single(later.Known).TookOver);
        Assert.Single(archive.ListRuns().Rows);
        Assert.Single(archive.RunHistory(runId).Rows);
    }

    [Fact]
    public void Different_runs_of_one_box_keep_different_fingerprints()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        archive.File(LogAnalyzer.Analyze(TestLogs.Hatch, "a.log", "test"));
        ImportOutcome second = archive.File(LogAnalyzer.Analyze(TestLogs.SecondHatch, "b.log", "test"));

        Assert.Single(second.Runs);
        Assert.Empty(second.Known);
        Assert.Equal(2, archive.ListRuns().Rows.Count);
    }

    [Fact]
    public void Reanalysis_uses_each_runs_own_event_weather_not_its_first_log_mates()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        archive.AddRecord(RecordKind.Event, "Dry morning", new Dictionary<string, string?> { ["date"] = "2026-06-06" });
        archive.AddRecord(RecordKind.Event, "Hot afternoon", new Dictionary<string, string?> { ["date"] = "2026-06-07", ["weather"] = "31,995,40" });

        // Two power-ups in one file: the box appended its second session to the first.
        byte[] joined = [.. TestLogs.Hatch, .. TestLogs.Roadster];
        ResolvedAssignment morning = archive.Resolve(new RunAssignment { Event = "Dry morning" });
        ImportOutcome filed = archive.File(LogAnalyzer.Analyze(joined, "card.log", "test"), morning);
        Assert.Equal(2, filed.Runs.Count);
        long secondRun = filed.Runs[1].RunId;
        Assert.DoesNotContain("standard_air", archive.ShowRun(secondRun).ReportJson);

        archive.AssignRun(secondRun, new RunAssignment { Event = "Hot afternoon" });
        archive.Reanalyse("test-2", everything: true);

        Assert.Contains("standard_air", archive.ShowRun(secondRun).ReportJson);
        Assert.DoesNotContain("standard_air", archive.ShowRun(filed.Runs[0].RunId).ReportJson);
        Assert.Equal(2, archive.ListRuns().Rows.Count);
    }

    [Fact]
    public void Run_edit_moves_a_run_to_another_event_car_and_driver()
    {
        using var temp = new TempFolder();
        string path = temp.File("a.db");
        using (SessionArchive archive = SessionArchive.Open(path))
        {
            archive.File(LogAnalyzer.Analyze(TestLogs.Hatch, "a.log", "test"));
            archive.AddRecord(RecordKind.Event, "Club sprint", new Dictionary<string, string?> { ["date"] = "2026-06-06" });
            archive.AddRecord(RecordKind.Driver, "Pat Example", new Dictionary<string, string?>());
            archive.AddRecord(RecordKind.Car, "Blue hatch", new Dictionary<string, string?>());
        }

        var output = new StringWriter();
        var error = new StringWriter();
        LaunchLogger.Cli.ExitCode code = LaunchLogger.Cli.Verbs.RunCommand.Edit(
            path, 1, new RunAssignment { Event = "Club sprint", Driver = "Pat Example", Car = "Blue hatch" }, null, null, output, error);

        Assert.True(code == LaunchLogger.Cli.ExitCode.Ok, error.ToString());
        Assert.Contains("changed run 1", output.ToString());
        using SessionArchive reopened = SessionArchive.Open(path);
        Dictionary<string, object?> run = reopened.ShowRun(1).Row.AsObjects().Single();
        Assert.Equal("Club sprint", run["event"]);
        Assert.Equal("Pat Example", run["driver"]);
        Assert.Equal("Blue hatch", run["car"]);
    }

    /// <summary>The log with one frame from its middle cut out, as a serial link that dropped
    /// it would deliver it (frames end at each zero byte: LOG-FORMAT.md).</summary>
    private static byte[] WithoutOneFrame(byte[] log)
    {
        var ends = new List<int>();
        for (int i = 0; i < log.Length; i++)
        {
            if (log[i] == 0)
            {
                ends.Add(i);
            }
        }

        int cut = ends.Count / 2;
        int from = ends[cut - 1] + 1, to = ends[cut] + 1;
        return [.. log.AsSpan(0, from), .. log.AsSpan(to)];
    }
}
