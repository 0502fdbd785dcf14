using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Runs;
using Xunit.Abstractions;

namespace LaunchLogger.Cli.Tests.Memory;

/// <summary>Each verb that reads logs keeps the memory of its largest run, not of the file: the
/// verb runs in-process on a short log and then on a long one made of the same run repeated,
/// while a second thread samples the live heap (forced full collections, GC counters); the long
/// log's peak may exceed the short one's by at most a few runs — kept, its twelve more runs would
/// add one run read and analysed each.</summary>
[Collection(VerbMemoryCollection.Name)]
public class StreamingVerbMemoryTests(ITestOutputHelper log)
{
    /// <summary>Runs in the short log: enough to fill the reader's read-ahead (runs as read and
    /// not yet taken: 2 × cores but never more than <see cref="RunPipeline.MaxRunsAhead"/>, fewer
    /// when they reach <see cref="RunPipeline.DefaultBytesAhead"/>) and three more, so that both
    /// logs fill it and the long log's extra runs are what is compared, on a machine of any core
    /// count (DEVELOPERS.md, "Tests on other machines").</summary>
    private const int Short = RunPipeline.MaxRunsAhead + 3;

    /// <summary>Runs in the long log: twelve more than the short one.</summary>
    private const int Long = Short + 12;

    /// <summary>How much more the verb may hold at its peak on the long log than on the short
    /// one, in runs read and analysed: the next run read while one is analysed, what is kept per
    /// run (report entries, names), and room for a peak the sampler missed on the short log.
    /// Keeping every run would add <see cref="Long"/> − <see cref="Short"/>.</summary>
    private const double GrowthInRuns = 4;

    /// <summary>Copies read, analysed and held at once to measure <see cref="OneRun"/>.</summary>
    private const int Held = 4;

    /// <summary>One run as read and its analysis, both held (what a verb keeping runs keeps per
    /// run), bytes.</summary>
    /// <remarks>Measured as the live heap after <see cref="Held"/> runs were read, analysed and
    /// kept, less the live heap after the same were read, analysed and let go, over
    /// <see cref="Held"/>. Both samples follow the same work, so the shared array pool (which
    /// keeps the analysis's working arrays and gives them up as its own clock and the machine's
    /// memory load decide) is in the same state in both. Measured from a sample before any work,
    /// a CI machine once read 714 KB where this one reads 1.6 MB.</remarks>
    private static readonly Lazy<long> OneRun = new(() =>
    {
        byte[] bytes = SimulatedLogs.Default.LogBytes;
        ReadAndAnalyse(bytes, []);
        long letGo = VerbMemoryCollection.LiveBytes();
        var held = new List<object>(2 * Held);
        ReadAndAnalyse(bytes, held);
        long kept = VerbMemoryCollection.LiveBytes();
        GC.KeepAlive(held);
        return (kept - letGo) / Held;

        static void ReadAndAnalyse(byte[] bytes, List<object> keep)
        {
            for (int i = 0; i < Held; i++)
            {
                DecodedRun run = LogReader.Read(bytes, "one.log").Runs.Single();
                RunAnalysis analysis = RunAnalyzer.Analyze(run);
                keep.Add(run);
                keep.Add(analysis);
            }
        }
    });

    [Fact]
    public void ReportHoldsAFewRunsNotTheLog() => AssertBounded("report --json", (log, folder, runs) =>
    {
        var output = new StringWriter();
        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true }, output, TextWriter.Null);
        return () =>
        {
            Assert.True(code is ExitCode.Ok or ExitCode.Partial, $"report exited {code}");
            Assert.Equal(runs, CountOf(output.ToString(), "\"verdict\": {"));
        };
    });

    [Fact]
    public void ImportHoldsAFewRunsNotTheLog() => AssertBounded("import", (log, folder, runs) =>
    {
        var output = new StringWriter();
        ExitCode code = ImportCommand.Run(Path.Combine(folder, $"archive-{runs}.db"), [log], RunAssignment.None, json: false, output, TextWriter.Null);
        return () =>
        {
            Assert.Equal(ExitCode.Ok, code);

            // Every run is analysed; the simulated copies are one box run (same number and
            // opening), so the first is filed and the rest are known copies of it.
            Assert.Contains("1 new log(s)", output.ToString(), StringComparison.Ordinal);
            Assert.Equal(runs, CountOf(output.ToString(), "box run"));
        };
    });

    [Fact]
    public void PlotHoldsAFewRunsNotTheLog() => AssertBounded("plot", (log, folder, runs) =>
    {
        string picture = Path.Combine(folder, $"trace{runs}.svg");
        ExitCode code = PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(log)], Out = picture }, TextWriter.Null, TextWriter.Null);
        return () =>
        {
            Assert.Equal(ExitCode.Ok, code);
            Assert.All(Enumerable.Range(1, runs), n => Assert.True(File.Exists(Path.Combine(folder, $"trace{runs}-run{n}.svg")), $"trace{runs}-run{n}.svg"));
        };
    });

    [Fact]
    public void CardHoldsAFewRunsNotTheLog() => AssertBounded("card", (log, folder, runs) =>
    {
        string page = Path.Combine(folder, $"cards{runs}.html");
        ExitCode code = CardCommand.Run(new ReportRequest { Logs = [new FileInfo(log)] }, null, null, null, null, new FileInfo(page), DisplayUnits.Metric, TextWriter.Null, TextWriter.Null);
        return () =>
        {
            Assert.True(code is ExitCode.Ok or ExitCode.Partial, $"card exited {code}");
            Assert.Equal(runs, CountOf(File.ReadAllText(page), "<article class=\"card\""));
        };
    });

    [Fact]
    public void ArchivedCardHoldsAFewRunsNotTheLog() => AssertBounded(
        "card --archived",
        (log, folder, runs) =>
        {
            // The filed run is the log's first; its card reads the whole stored log again for
            // the session's grip bound (the other copies are known copies of the same box run).
            string page = Path.Combine(folder, $"archived{runs}.html");
            ExitCode code = CardCommand.Run(new ReportRequest(), null, 1, ArchiveOf(log), null, new FileInfo(page), DisplayUnits.Metric, TextWriter.Null, TextWriter.Null);
            return () =>
            {
                Assert.Equal(ExitCode.Ok, code);
                Assert.Equal(1, CountOf(File.ReadAllText(page), "<article class=\"card\""));
            };
        },
        FileInArchive);

    [Fact]
    public void ReanalysisReadsTheStoredLogInBlocks()
    {
        // The same three runs filed twice, once followed by 48 MB the reader skips as damage:
        // re-analysing holds no more for the longer log than a block of it, where holding the
        // stored bytes whole would add all 48 MB.
        const int fillerBytes = 48 * 1024 * 1024;
        using var folder = new TempFolder();
        string plain = Season(folder, Short);
        string padded = folder.File("padded.log");
        using (FileStream file = File.Create(padded))
        {
            file.Write(File.ReadAllBytes(plain));
            byte[] filler = new byte[1024 * 1024];
            Array.Fill(filler, (byte)0x55);
            for (int written = 0; written < fillerBytes; written += filler.Length)
            {
                file.Write(filler);
            }
        }

        FileInArchive(plain);
        FileInArchive(padded);
        long[] peaks = new long[2];
        string[] logs = [plain, padded];
        for (int pass = 0; pass < 3; pass++)
        {
            for (int i = 0; i < logs.Length; i++)
            {
                (ExitCode code, long peak) = VerbMemoryCollection.PeakLiveDuring(() => ReanalyseCommand.Run(ArchiveOf(logs[i]), all: true, json: false, TextWriter.Null, TextWriter.Null));
                Assert.True(code is ExitCode.Ok or ExitCode.Partial, $"reanalyse exited {code}");
                peaks[i] = pass == 0 ? 0 : Math.Max(peaks[i], peak);
            }
        }

        log.WriteLine($"reanalyse: peak {peaks[0]:N0} bytes without the damage, {peaks[1]:N0} with; allowed growth {fillerBytes / 4:N0}");
        Assert.True(peaks[1] - peaks[0] < fillerBytes / 4, $"reanalyse peaked at {peaks[1]:N0} bytes live with {fillerBytes:N0} bytes of damage after the runs and at {peaks[0]:N0} without");
    }

    [Fact]
    public void TheBoundCatchesAVerbThatKeepsEveryRun()
    {
        // The check can fail: the whole-session analysis, which keeps every run's analysis, grows
        // past the bound on the same logs.
        (long shortPeak, long longPeak) = Peaks((log, _, runs) =>
        {
            int analysed = SessionAnalyzer.Analyze(LogReader.ReadFile(log).Runs).Runs.Count;
            return () => Assert.Equal(runs, analysed);
        });
        log.WriteLine($"keeping every run: peak {shortPeak:N0} bytes on {Short} runs, {longPeak:N0} on {Long}; one run {OneRun.Value:N0}, the bound {Allowed:N0}");
        Assert.True(longPeak - shortPeak > Allowed, $"keeping every run grew the peak by {longPeak - shortPeak:N0} bytes from {Short} to {Long} runs, within the bound {Allowed:N0}");
    }

    private static long Allowed => (long)(GrowthInRuns * OneRun.Value);

    private void AssertBounded(string verb, Func<string, string, int, Action> run, Action<string>? prepare = null)
    {
        (long shortPeak, long longPeak) = Peaks(run, prepare);

        // A run as read holds at least its records, which are most of the log's bytes: a
        // smaller figure is a measurement gone wrong.
        long logBytes = SimulatedLogs.Default.LogBytes.Length;
        log.WriteLine($"{verb}: peak {shortPeak:N0} bytes on {Short} runs, {longPeak:N0} on {Long}; one run {OneRun.Value:N0} (its log {logBytes:N0}), the growth allowed {Allowed:N0}");
        Assert.True(OneRun.Value > logBytes, $"one run read and analysed ({OneRun.Value:N0} bytes) should hold more than its log's {logBytes:N0} bytes");
        Assert.True(
            longPeak - shortPeak < Allowed,
            $"{verb} peaked at {longPeak:N0} bytes live on {Long} runs and {shortPeak:N0} on {Short}; one run read and analysed is {OneRun.Value:N0} bytes, the growth allowed {Allowed:N0}");
    }

    /// <summary>The verb's peak live heap above its start on the short log (the higher of two
    /// passes) and on the long log, after a first pass on the short log, so that what the verb
    /// sets up once is there in all.
    /// <paramref name="run"/> runs the verb and returns the checks of its output, made after the
    /// measurement (reading a long output back would count against the verb).
    /// <paramref name="prepare"/>, when given, is done to each log before anything is measured.</summary>
    private static (long Short, long Long) Peaks(Func<string, string, int, Action> run, Action<string>? prepare = null)
    {
        using var folder = new TempFolder();
        string shortLog = Season(folder, Short);
        string longLog = Season(folder, Long);
        prepare?.Invoke(shortLog);
        prepare?.Invoke(longLog);
        run(shortLog, Path.Combine(folder.Path, "warm"), Short)();
        long shortPeak = 0;
        foreach (string pass in new[] { "first", "second" })
        {
            (Action checkShort, long peak) = VerbMemoryCollection.PeakLiveDuring(() => run(shortLog, Path.Combine(folder.Path, pass), Short));
            checkShort();
            shortPeak = Math.Max(shortPeak, peak);
        }

        (Action checkLong, long longPeak) = VerbMemoryCollection.PeakLiveDuring(() => run(longLog, folder.Path, Long));
        checkLong();
        return (shortPeak, longPeak);
    }

    /// <summary>The archive a log is filed in by <see cref="FileInArchive"/>.</summary>
    private static string ArchiveOf(string log) => log + ".db";

    /// <summary>Files a log in an archive of its own (<see cref="ArchiveOf"/>).</summary>
    private static void FileInArchive(string log)
    {
        ExitCode code = ImportCommand.Run(ArchiveOf(log), [log], RunAssignment.None, json: false, TextWriter.Null, TextWriter.Null);
        Assert.True(code is ExitCode.Ok or ExitCode.Partial, $"import exited {code}");
    }

    /// <summary>A season-like log: one simulated run's bytes repeated (each copy is a power-up of its own).</summary>
    private static string Season(TempFolder folder, int copies)
    {
        byte[] one = SimulatedLogs.Default.LogBytes;
        string path = folder.File($"season{copies}.log");
        using (FileStream file = File.Create(path))
        {
            for (int i = 0; i < copies; i++)
            {
                file.Write(one);
            }
        }

        return path;
    }

    private static int CountOf(string text, string what)
    {
        int count = 0;
        for (int at = text.IndexOf(what, StringComparison.Ordinal); at >= 0; at = text.IndexOf(what, at + what.Length, StringComparison.Ordinal))
        {
            count++;
        }

        return count;
    }
}
