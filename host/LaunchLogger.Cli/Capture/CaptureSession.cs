using System.Buffers;
using System.Collections.Concurrent;
using System.Diagnostics;
using System.Globalization;
using System.Text.Json;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Cli.Capture;

/// <summary>Receives the box's bytes until cancelled: every byte goes to the raw file first
/// (flushed before anything else looks at it), then frames are decoded as they arrive for the
/// status line, and each run that closes is analysed — and filed in the archive, if one is
/// given — from its own slice of the bytes, on a worker so reading never waits.</summary>
/// <remarks>When the link goes away the session waits, reopens it when it comes back and
/// records the gap; the run it fell in is analysed with whatever the gap cost (the reader
/// charges lost and damaged frames to it) and carries a note of the gap.</remarks>
public sealed class CaptureSession
{
    private const int ReadBlockBytes = 4096;
    private static readonly JsonSerializerOptions JsonLines = new(ArchiveTableWriter.JsonOptions) { WriteIndented = false };
    private readonly ILink link;
    private readonly CaptureOptions options;
    private readonly TextWriter output;
    private readonly object outputGate = new();
    private readonly LiveStatus live = new();
    private readonly List<LinkGap> gaps = [];
    private readonly MemoryStream runBytes = new();
    private readonly byte[] pending = new byte[LogFormat.MaxEncodedFrameBytes + ReadBlockBytes];
    private readonly byte[] payload = new byte[LogFormat.MaxPayloadBytes];
    private readonly BlockingCollection<(byte[] Bytes, long Start, List<LinkGap> Gaps)> closed = new();
    private readonly List<CapturedRun> captured = [];
    private readonly List<string> problems = [];
    private readonly RunAssembler assembler;
    private FrameReader reader;
    private int pendingCount;
    private long pendingStart;
    private long sliceStart;
    private long received;
    private long lastStatusTicks;
    private bool statusShown;

    /// <summary>A session reading <paramref name="link"/>.</summary>
    public CaptureSession(ILink link, CaptureOptions options, TextWriter output)
    {
        this.link = link;
        this.options = options;
        this.output = output;
        assembler = new RunAssembler(Path.GetFileName(options.OutPath));
    }

    /// <summary>Captures until <paramref name="cancel"/> fires, then flushes, closes the raw file,
    /// analyses (and files) a run left open as cut off, and returns.</summary>
    /// <exception cref="ArchiveException">The archive cannot be opened or a name in the assignment matches nothing (checked before reading starts).</exception>
    /// <exception cref="IOException">The raw file cannot be written.</exception>
    public CaptureResult Run(CancellationToken cancel)
    {
        SessionArchive? archive = options.ArchivePath is { } path ? SessionArchive.Open(path) : null;
        try
        {
            ResolvedAssignment assignment = archive?.Resolve(options.Assignment) ?? new ResolvedAssignment();
            Task worker = Task.Factory.StartNew(() => FileClosedRuns(archive, assignment), TaskCreationOptions.LongRunning);
            try
            {
                using (var raw = new FileStream(options.OutPath, FileMode.CreateNew, FileAccess.Write, FileShare.Read, 1, FileOptions.None))
                {
                    Receive(raw, cancel);
                    raw.Flush(flushToDisk: true);
                }

                Finish();
            }
            finally
            {
                closed.CompleteAdding();
                worker.Wait();
            }

            return new CaptureResult(received, captured, gaps, problems);
        }
        finally
        {
            archive?.Dispose();
        }
    }

    private void Receive(FileStream raw, CancellationToken cancel)
    {
        byte[] block = new byte[ReadBlockBytes];
        var lastDiskFlush = Stopwatch.StartNew();
        while (!cancel.IsCancellationRequested)
        {
            ILinkConnection? connection = OpenWhenAvailable(cancel);
            if (connection is null)
            {
                return;
            }

            using (connection)
            {
                while (!cancel.IsCancellationRequested)
                {
                    int n;
                    try
                    {
                        n = connection.Read(block);
                    }
                    catch (LinkLostException e)
                    {
                        gaps.Add(new LinkGap(received, DateTime.UtcNow, 0));
                        Say($"link lost after {received:N0} bytes ({e.Message}); waiting for {link.Name} to come back", new { @event = "link_lost", at_byte = received });
                        break;
                    }

                    if (n == 0)
                    {
                        continue;
                    }

                    // Nothing is looked at before it is on its way to disk.
                    raw.Write(block, 0, n);
                    raw.Flush();
                    if (lastDiskFlush.ElapsedMilliseconds >= 1000)
                    {
                        raw.Flush(flushToDisk: true);
                        lastDiskFlush.Restart();
                    }

                    received += n;
                    Feed(block.AsSpan(0, n), isFinal: false);
                }
            }
        }
    }

    private ILinkConnection? OpenWhenAvailable(CancellationToken cancel)
    {
        bool said = false;
        while (!cancel.IsCancellationRequested)
        {
            try
            {
                ILinkConnection connection = link.Open();
                if (gaps.Count > 0 && gaps[^1].DownS == 0)
                {
                    LinkGap gap = gaps[^1];
                    gaps[^1] = gap with { DownS = Math.Max((DateTime.UtcNow - gap.LostUtc).TotalSeconds, 1e-6) };
                    Say($"link back after {gaps[^1].DownS:0.0} s; the run it fell in is judged with the gap", new { @event = "link_back", at_byte = received, down_s = gaps[^1].DownS });
                }
                else if (!said)
                {
                    Say($"reading {link.Name}; raw bytes to {options.OutPath}{(options.ArchivePath is { } a ? $"; closed runs filed in {a}" : "")}; Ctrl+C to stop", new { @event = "open", port = link.Name });
                }

                return connection;
            }
            catch (LinkLostException e)
            {
                if (!said)
                {
                    IReadOnlyList<string>? found = options.PortNames?.Invoke();
                    string hint = found is null ? "" : $"; {PortHint.Found(found)}. If the box is on another port, stop with Ctrl+C and {PortHint.HowToName}";
                    Say($"waiting for {link.Name}: {e.Message}{hint}", new { @event = "waiting", port = link.Name, ports_found = found });
                    said = true;
                }

                cancel.WaitHandle.WaitOne(options.ReopenEvery);
            }
        }

        return null;
    }

    private void Feed(ReadOnlySpan<byte> bytes, bool isFinal)
    {
        runBytes.Write(bytes);
        bytes.CopyTo(pending.AsSpan(pendingCount));
        pendingCount += bytes.Length;
        int position = 0;
        while (true)
        {
            long frameStart = pendingStart + position;
            OperationStatus status = reader.TryReadFrame(pending.AsSpan(position, pendingCount - position), payload, isFinal, out int used, out Frame frame);
            position += used;
            if (status == OperationStatus.NeedMoreData)
            {
                break;
            }

            if (status != OperationStatus.Done)
            {
                continue;
            }

            int runsBefore = assembler.Runs.Count;
            bool opensRun = frame.Type == FrameType.Configuration;
            bool changed = live.Add(frame);
            assembler.Add(frame, reader.Stats);
            if (assembler.Runs.Count > runsBefore)
            {
                // A run closed: by its summary (its slice ends here) or cut off by the next
                // configuration (its slice ends where that frame began).
                Cut(opensRun ? frameStart : pendingStart + position);
            }

            ShowStatus(changed);
        }

        pending.AsSpan(position, pendingCount - position).CopyTo(pending);
        pendingCount -= position;
        pendingStart += position;
    }

    private void Finish()
    {
        Feed([], isFinal: true);
        int runsBefore = assembler.Runs.Count;
        LogReadResult result = assembler.Complete(reader.Stats);
        if (result.Runs.Count > runsBefore)
        {
            Cut(received);
        }

        Say($"stopped: {received:N0} bytes in {options.OutPath}, {result.Runs.Count} run(s), {gaps.Count} link gap(s)", new { @event = "stopped", bytes = received, runs = result.Runs.Count, link_gaps = gaps.Count });
    }

    private void Cut(long end)
    {
        int length = (int)(end - sliceStart);
        byte[] all = runBytes.GetBuffer();
        byte[] slice = all.AsSpan(0, length).ToArray();
        int rest = (int)runBytes.Length - length;
        Buffer.BlockCopy(all, length, all, 0, rest);
        runBytes.SetLength(rest);
        List<LinkGap> inside = gaps.Where(g => g.AtByte >= sliceStart && g.AtByte <= end).Select(g => g with { AtByte = g.AtByte - sliceStart }).ToList();
        closed.Add((slice, sliceStart, inside));
        sliceStart = end;
    }

    private void FileClosedRuns(SessionArchive? archive, ResolvedAssignment assignment)
    {
        foreach ((byte[] bytes, long start, List<LinkGap> inside) in closed.GetConsumingEnumerable())
        {
            string source = string.Create(CultureInfo.InvariantCulture, $"{Path.GetFileName(options.OutPath)} bytes {start}-{start + bytes.Length}");
            try
            {
                AnalysedLog log = LogAnalyzer.Analyze(bytes, source, ToolInfo.Version, assignment.Calibration, assignment.Weather);
                if (inside.Count > 0)
                {
                    string note = string.Create(CultureInfo.InvariantCulture, $"capture: the serial link was down {inside.Count} time(s), {inside.Sum(g => g.DownS):0.0} s in all, during this run");
                    log = log with { Runs = log.Runs.Select(r => r with { Report = r.Report is { } rep ? rep with { Warnings = [.. rep.Warnings, note] } : null }).ToList() };
                }

                ImportOutcome? filed = archive?.File(log, assignment, inside);
                foreach (AnalysedRun run in log.Runs)
                {
                    long? runId = filed?.Runs.FirstOrDefault(r => r.Run.Position == run.Position).RunId;
                    captured.Add(new CapturedRun(run, runId, inside));
                    SayRun(run, runId, inside);
                }
            }
            catch (Exception e) when (e is ArchiveException or Microsoft.Data.Sqlite.SqliteException or IOException)
            {
                string problem = $"{source}: not filed: {e.Message} (the bytes are in {options.OutPath}; `launchlogger import` it later)";
                problems.Add(problem);
                Say(problem, new { @event = "not_filed", source, reason = e.Message });
            }
        }
    }

    private void SayRun(AnalysedRun run, long? runId, List<LinkGap> inside)
    {
        var figures = new Dictionary<string, FigureValue>();
        if (run.Report is { } report)
        {
            foreach (BoardFigure f in BoardFigures.All)
            {
                if (f.Read(report) is { } v)
                {
                    figures[f.Code] = v;
                }
            }
        }

        string Time(string code) => figures.TryGetValue(code, out FigureValue? v) && v.Standstill is { } s
            ? string.Create(CultureInfo.InvariantCulture, $"{s:0.000} s{(v.Rollout is { } r && BoardFigures.Find(code)!.HasConventions ? $" ({r:0.000} after rollout)" : "")}")
            : "—";
        string trap = figures.TryGetValue("trap", out FigureValue? t) ? Format.Speed(t.Standstill, options.Units) : "—";
        string stop = figures.TryGetValue("stop", out FigureValue? st) && st.Standstill is { } d ? Format.Distance(d, options.Units) : "—";
        string verdict = run.Report?.Verdict is { } vr && vr.Reasons.Count > 0 ? $"{run.Verdict} ({string.Join(", ", vr.Reasons.Select(x => x.Code))})" : run.Verdict;
        string filed = runId is { } id ? $"  filed as run {id}" : "";
        string gapNote = inside.Count > 0 ? $"  link gap {inside.Sum(g => g.DownS):0.0} s" : "";
        Say(
            $"run {run.BoxRun} closed: 0-60 mph {Time("0-60mph")}  60 ft {Time("60ft")}  1/4 mile {Time("quarter")}  trap {trap}  stop {stop}  {verdict}{gapNote}{filed}{(run.Failure is { } failure ? "  " + failure : "")}",
            new
            {
                @event = "run_closed",
                box_run = run.BoxRun,
                archive_run = runId,
                verdict = run.Verdict,
                reasons = run.Report?.Verdict?.Reasons.Select(x => x.Code) ?? [],
                figures,
                link_gaps = inside,
                failure = run.Failure,
            });
    }

    private void ShowStatus(bool changed)
    {
        if (options.Json)
        {
            return;
        }

        long now = Stopwatch.GetTimestamp();
        if (!changed && Stopwatch.GetElapsedTime(lastStatusTicks, now) < options.StatusEvery)
        {
            return;
        }

        lastStatusTicks = now;
        lock (outputGate)
        {
            if (options.Overwrite)
            {
                output.Write("\r" + live.Line(options.Units).PadRight(100));
                statusShown = true;
            }
            else
            {
                output.WriteLine(live.Line(options.Units));
            }

            output.Flush();
        }
    }

    private void Say(string text, object json)
    {
        lock (outputGate)
        {
            if (options.Json)
            {
                output.WriteLine(JsonSerializer.Serialize(json, JsonLines));
            }
            else
            {
                if (statusShown)
                {
                    output.Write("\r" + new string(' ', 100) + "\r");
                    statusShown = false;
                }

                output.WriteLine(text);
            }

            output.Flush();
        }
    }
}
