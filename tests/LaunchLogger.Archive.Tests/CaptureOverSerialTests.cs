using System.Diagnostics;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Tests.Support;
using LaunchLogger.Cli;
using LaunchLogger.Cli.Output;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Tests.Support;

namespace LaunchLogger.Archive.Tests;

/// <summary>`capture` end to end over a real serial port: an in-process pseudo-terminal opened
/// through System.IO.Ports, fed at the box's line speed, with the cable pulled mid-run.</summary>
public class CaptureOverSerialTests
{
    // 115200 bit/s with 8 data bits, no parity, 1 stop bit (10 bits a byte on the wire, common
    // practice for asynchronous serial framing) = 11520 bytes/s: the box's line speed.
    private const double BytesPerSecond = CaptureCommand.BoxBaudRate / 10.0;
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(60);

    [Fact]
    public async Task Capture_files_every_run_through_a_pulled_cable_and_the_board_shows_the_reports_figures()
    {
        using var temp = new TempFolder();
        byte[] first = TestLogs.Hatch;
        byte[] second = TestLogs.SecondHatch;

        // The cable comes out part-way through the second run; what the box sends meanwhile
        // never arrives. A stable port name (a symbolic link, as /dev/serial/by-id gives) lets
        // capture find the port again when it is plugged back in.
        int pullAt = first.Length + second.Length / 2;
        int lostBytes = 2500;
        byte[] stream = [.. first, .. second];
        string port = temp.File("box-port");
        string raw = temp.File("capture.log");
        string archive = temp.File("season.db");

        var sent = new MemoryStream();
        var output = new StringWriter();
        TextWriter said = TextWriter.Synchronized(output);
        using var stop = new CancellationTokenSource();
        PseudoTerminalPair pair = PseudoTerminalPair.Open(port);
        PseudoTerminalPair? replugged = null;
        try
        {
            Task<ExitCode> capture = Task.Run(() => CaptureCommand.Run(port, CaptureCommand.BoxBaudRate, raw, archive, RunAssignment.None, DisplayUnits.Metric, false, said, new StringWriter(), stop.Token));
            // The box starts sending once capture has the port open: bytes written before that are
            // discarded when it opens (as on a real port), and the test would count them as sent.
            await WaitForOutput(said, output, "Ctrl+C to stop");
            var random = new Random(11);
            var pace = Stopwatch.StartNew();
            long paced = 0;
            for (int at = 0; at < stream.Length;)
            {
                if (at == pullAt)
                {
                    // Pull the cable only once capture has taken every byte sent so far, then
                    // lose what the box sends while it is out, and plug in again.
                    await WaitForLength(raw, sent.Length);
                    pair.HangUp();
                    await Task.Delay(600);
                    at += lostBytes;
                    replugged = PseudoTerminalPair.Open(port);

                    // Bytes the box sends before capture has the port open again are lost, as on a
                    // real cable (opening a serial port discards what waits in its buffer); the
                    // lost stretch above stands for them, so send again only once capture says so.
                    await WaitForOutput(said, output, "link back");
                }

                int end = at < pullAt ? Math.Min(pullAt, at + random.Next(16, 768)) : Math.Min(stream.Length, at + random.Next(16, 768));
                (replugged ?? pair).Write(stream, at, end - at, Patience);
                sent.Write(stream, at, end - at);
                paced += end - at;
                at = end;
                TimeSpan due = TimeSpan.FromSeconds(paced / BytesPerSecond);
                if (due > pace.Elapsed)
                {
                    await Task.Delay(due - pace.Elapsed);
                }
            }

            await WaitForLength(raw, sent.Length);
            stop.Cancel();
            Assert.Equal(ExitCode.Ok, await capture);
        }
        finally
        {
            stop.Cancel();

            // The first pair first: the link now points at the second, which removes it.
            pair.Dispose();
            replugged?.Dispose();
        }

        Assert.Equal(sent.ToArray(), File.ReadAllBytes(raw));
        Assert.Contains("link lost", output.ToString());
        Assert.Contains("link back", output.ToString());

        // `report` on the same bytes, and the board from the archive capture filed into.
        var json = new StringWriter();
        ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(raw)], Json = true }, json, new StringWriter());
        ReportDocument report = ReportJson.Deserialize(json.ToString())!;
        Assert.Equal(2, report.Runs.Count);
        using SessionArchive opened = SessionArchive.Open(archive);
        foreach ((string code, Convention convention) in new[] { ("0-60mph", Convention.Standstill), ("0-60mph", Convention.Rollout), ("60ft", Convention.Rollout) })
        {
            BoardFigure figure = BoardFigures.Find(code)!;
            BoardResult board = opened.Board(new BoardRequest { Figure = figure, Convention = convention, Accept = Acceptance.All, EveryRun = true });
            List<BoardRow> rows = board.Sections.Single().Rows.OrderBy(r => r.Run).ToList();
            Assert.Equal(2, rows.Count);
            for (int i = 0; i < 2; i++)
            {
                FigureValue expected = figure.Read(report.Runs[i])!;
                Assert.Equal(convention == Convention.Rollout ? expected.Rollout : expected.Standstill, rows[i].Value);
            }
        }
    }

    private static async Task WaitForOutput(TextWriter said, StringWriter output, string text)
    {
        var clock = Stopwatch.StartNew();
        while (true)
        {
            // The synchronized writer locks on itself; take the same lock to read what it wrote.
            lock (said)
            {
                if (output.ToString().Contains(text, StringComparison.Ordinal))
                {
                    return;
                }
            }

            Assert.True(clock.Elapsed < Patience, $"capture never said \"{text}\"");
            await Task.Delay(20);
        }
    }

    private static async Task WaitForLength(string path, long length)
    {
        var clock = Stopwatch.StartNew();
        while (!File.Exists(path) || new FileInfo(path).Length < length)
        {
            Assert.True(clock.Elapsed < Patience, $"capture wrote {(File.Exists(path) ? new FileInfo(path).Length : 0)} of {length} bytes");
            await Task.Delay(50);
        }
    }
}
