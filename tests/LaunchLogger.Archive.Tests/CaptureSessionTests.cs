using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Tests.Support;
using LaunchLogger.Cli;
using LaunchLogger.Cli.Output;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Archive.Tests;

public class CaptureSessionTests
{
    [Fact]
    public async Task Every_byte_is_kept_every_run_filed_and_a_gap_is_marked_on_its_run()
    {
        using var temp = new TempFolder();
        byte[] first = TestLogs.Hatch;
        byte[] second = TestLogs.Roadster;

        // The cable is pulled part-way through the second run; what the box sent meanwhile is
        // lost, so the bytes sent are the stream with a hole in it.
        int cut = second.Length / 2;
        int lost = 3000;
        byte[] sent = [.. first, .. second.AsSpan(0, cut), .. second.AsSpan(cut + lost)];
        var random = new Random(7);
        var before = Chunks(sent.AsSpan(0, first.Length + cut).ToArray(), random);
        var after = Chunks(sent.AsSpan(first.Length + cut).ToArray(), random);
        var link = new ScriptedLink([before, after]);

        string raw = temp.File("capture.log");
        string archive = temp.File("a.db");
        var output = new StringWriter();
        using var stop = new CancellationTokenSource();
        Task<ExitCode> capture = Task.Run(() => CaptureCommand.Run(link, raw, archive, RunAssignment.None, DisplayUnits.Imperial, false, TextWriter.Synchronized(output), new StringWriter(), stop.Token));
        Assert.True(link.AllDelivered.Wait(TimeSpan.FromMinutes(2)));
        stop.Cancel();
        Assert.Equal(ExitCode.Ok, await capture);

        Assert.Equal(sent, File.ReadAllBytes(raw));
        string text = output.ToString();
        Assert.Contains("link lost after", text);
        Assert.Contains("link back after", text);
        Assert.Contains("run 1 closed", text);

        // The board lists both runs with the figures `report` gives for the same bytes.
        var json = new StringWriter();
        ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(raw)], Json = true }, json, new StringWriter());
        ReportDocument report = ReportJson.Deserialize(json.ToString())!;
        Assert.Equal(2, report.Runs.Count);
        using SessionArchive opened = SessionArchive.Open(archive);
        var runs = opened.ListRuns().AsObjects().ToList();
        Assert.Equal(2, runs.Count);
        BoardResult board = opened.Board(new BoardRequest { Figure = BoardFigures.Find("60ft")!, Accept = Acceptance.All, EveryRun = true });
        var rows = board.Sections.Single().Rows.OrderBy(r => r.Run).ToList();
        Assert.Equal(2, rows.Count);
        for (int i = 0; i < 2; i++)
        {
            Assert.Equal(BoardFigures.Find("60ft")!.Read(report.Runs[i])!.Standstill, rows[i].Value);
        }

        // The run the gap fell in says so, and the reader charged it with the frames lost.
        (_, string? secondJson) = opened.ShowRun(rows[1].Run);
        RunReport filed = System.Text.Json.JsonSerializer.Deserialize<RunReport>(secondJson!, ReportJson.Options)!;
        Assert.Contains(filed.Warnings, w => w.Contains("serial link was down"));
        Assert.NotEqual("valid", filed.Verdict!.Level);
    }

    [Fact]
    public void A_capture_never_overwrites_an_earlier_one()
    {
        using var temp = new TempFolder();
        string raw = temp.File("capture.log");
        File.WriteAllBytes(raw, [1, 2, 3]);
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, CaptureCommand.Run(new ScriptedLink([]), raw, null, RunAssignment.None, DisplayUnits.Imperial, false, new StringWriter(), error));
        Assert.Contains("exists already", error.ToString());
        Assert.Equal([1, 2, 3], File.ReadAllBytes(raw));
    }

    /// <summary>Cuts bytes into bursts of 1 to 700 bytes, as a USB serial adapter hands them over.</summary>
    private static List<byte[]> Chunks(byte[] bytes, Random random)
    {
        var chunks = new List<byte[]>();
        for (int i = 0; i < bytes.Length;)
        {
            int n = Math.Min(random.Next(1, 700), bytes.Length - i);
            chunks.Add(bytes.AsSpan(i, n).ToArray());
            i += n;
        }

        return chunks;
    }
}
