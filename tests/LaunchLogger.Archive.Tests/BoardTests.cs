using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Archive.Tests.Support;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Archive.Tests;

public class BoardTests
{
    // 60 mph = 26.8224 m/s exactly (1 mph = 0.44704 m/s, international yard and pound agreement, 1959).
    private const double SixtyMph = 26.8224;

    [Fact]
    public void Each_driver_is_placed_by_their_best_valid_run_per_class()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = Archive(temp);
        File(archive, "Ash", "Street", 6.10, "valid");
        File(archive, "Ash", "Street", 5.90, "valid");
        File(archive, "Ash", "Street", 5.50, "doubtful");
        File(archive, "Bea", "Street", 6.00, "valid");
        File(archive, "Cal", "Modified", 4.80, "valid");

        BoardResult board = archive.Board(new BoardRequest { Figure = BoardFigures.Find("0-60mph")!, Filter = new RunFilter { Event = "Day 1" } });
        Assert.Equal(["Modified", "Street"], board.Sections.Select(s => s.Class));
        BoardSection street = board.Sections[1];
        Assert.Equal(["Ash", "Bea"], street.Rows.Select(r => r.Driver));
        Assert.Equal([1, 2], street.Rows.Select(r => r.Rank));
        Assert.Equal(5.90, street.Rows[0].Value);
        Assert.Equal(2, street.Rows[0].Runs);
        Assert.Equal(1, board.LeftOutForVerdict);

        // Asked to, the doubtful run counts and wins.
        BoardResult withDoubtful = archive.Board(new BoardRequest { Figure = BoardFigures.Find("0-60mph")!, Accept = Acceptance.Doubtful, Filter = new RunFilter { Class = "Street" } });
        Assert.Equal(5.50, withDoubtful.Sections.Single().Rows[0].Value);
    }

    [Fact]
    public void Rollout_convention_ranks_by_the_after_rollout_time()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = Archive(temp);
        File(archive, "Ash", "Street", 6.00, "valid", rolloutS: 5.80);
        File(archive, "Bea", "Street", 6.10, "valid", rolloutS: 5.60);
        var figure = BoardFigures.Find("0-60mph")!;
        Assert.Equal("Ash", archive.Board(new BoardRequest { Figure = figure }).Sections[0].Rows[0].Driver);
        BoardResult rollout = archive.Board(new BoardRequest { Figure = figure, Convention = Convention.Rollout });
        Assert.Equal("Bea", rollout.Sections[0].Rows[0].Driver);
        Assert.Equal(5.60, rollout.Sections[0].Rows[0].Value);
    }

    [Fact]
    public void Ties_go_to_the_smaller_uncertainty_then_to_the_run_filed_first()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = Archive(temp);
        File(archive, "Ash", "Street", 6.0004, "valid", sigma: 0.004);
        File(archive, "Bea", "Street", 5.9996, "valid", sigma: 0.002); // equal to Ash at 1 ms, better measured
        File(archive, "Cal", "Street", 6.0001, "valid", sigma: 0.004); // equal to Ash in value and σ, filed later
        BoardResult board = archive.Board(new BoardRequest { Figure = BoardFigures.Find("0-60mph")! });
        Assert.Equal(["Bea", "Ash", "Cal"], board.Sections[0].Rows.Select(r => r.Driver));
    }

    [Fact]
    public void Reruns_and_disqualifications_leave_the_ranking_and_are_listed_with_their_reason()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = Archive(temp);
        long fast = File(archive, "Ash", "Street", 5.0, "valid");
        File(archive, "Ash", "Street", 6.2, "valid");
        long bea = File(archive, "Bea", "Street", 5.5, "valid");
        archive.SetStanding(fast, RunStanding.Rerun, "timing beam blocked by a marshal");
        archive.SetStanding(bea, RunStanding.Disqualified, "crossed the centre line");
        Assert.Throws<ArchiveException>(() => archive.SetStanding(bea, RunStanding.Disqualified, " "));

        BoardResult board = archive.Board(new BoardRequest { Figure = BoardFigures.Find("0-60mph")! });
        BoardRow only = Assert.Single(board.Sections.Single().Rows);
        Assert.Equal(("Ash", 6.2), (only.Driver, only.Value));
        Assert.Equal(["rerun", "disqualified"], board.NotCounted.Select(r => r.Standing));
        Assert.Equal("crossed the centre line", board.NotCounted[1].StandingReason);
    }

    [Fact]
    public void Trap_speed_ranks_highest_first()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = Archive(temp);
        File(archive, "Ash", "Street", 6.0, "valid", trapMps: 40.0);
        File(archive, "Bea", "Street", 6.0, "valid", trapMps: 42.5);
        BoardResult board = archive.Board(new BoardRequest { Figure = BoardFigures.Find("trap")!, Convention = Convention.Rollout });
        Assert.Equal(["Bea", "Ash"], board.Sections[0].Rows.Select(r => r.Driver));
        Assert.Equal("none", board.Convention);
    }

    private static SessionArchive Archive(TempFolder temp)
    {
        SessionArchive archive = SessionArchive.Open(temp.File("board.db"));
        archive.AddRecord(RecordKind.Event, "Day 1", new Dictionary<string, string?> { ["date"] = "2026-05-01" });
        foreach (string c in new[] { "Street", "Modified" })
        {
            archive.AddRecord(RecordKind.Class, c, new Dictionary<string, string?>());
        }

        foreach (string d in new[] { "Ash", "Bea", "Cal" })
        {
            archive.AddRecord(RecordKind.Driver, d, new Dictionary<string, string?>());
        }

        return archive;
    }

    private static int filed;

    /// <summary>Files a run whose report says the given figures (the bytes are a placeholder, never decoded here).</summary>
    private static long File(SessionArchive archive, string driver, string className, double standstillS, string verdict, double? rolloutS = null, double sigma = 0.003, double? trapMps = null)
    {
        RunReport report = TestLogs.HatchAnalysed.Runs[0].Report! with
        {
            Verdict = new VerdictReport { Level = verdict, Reasons = [] },
            SpeedIntervals = [new SpeedIntervalReport { Label = "0-60 mph", FromMps = 0, ToMps = SixtyMph, FromStandstillS = standstillS, FromRolloutS = rolloutS ?? standstillS - 0.3, UncertaintyS = sigma, FromRolloutUncertaintyS = sigma }],
            DistanceMarks = trapMps is { } t ? [new DistanceMarkReport { Label = "1320 ft", DistanceM = 402.336, FromStandstillS = 14, FromRolloutS = 13.7, TrapSpeedMps = t }] : [],
        };
        byte[] bytes = BitConverter.GetBytes(Interlocked.Increment(ref filed)).Concat(Guid.NewGuid().ToByteArray()).ToArray();
        var log = new AnalysedLog(LogAnalyzer.Hash(bytes), "made.log", bytes, [new AnalysedRun(1, 1, "1.0.0", "made.log run 1", report, null)], [], "test");
        ImportOutcome outcome = archive.File(log, archive.Resolve(new RunAssignment { Event = "Day 1", Driver = driver, Class = className }));
        return outcome.Runs.Single().RunId;
    }
}
