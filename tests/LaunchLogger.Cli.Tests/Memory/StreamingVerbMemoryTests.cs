using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Tests.Memory;

/// <summary>Each verb that reads logs keeps the memory of its largest run, not of the file: the
/// verb runs in-process on a short log and then on a long one made of the same run repeated,
/// while a second thread samples the live heap (forced full collections, GC counters); the long
/// log's peak may exceed the short one's by at most a few runs — kept, its twelve more runs would
/// add one run read and analysed each.</summary>
[Collection(VerbMemoryCollection.Name)]
public class StreamingVerbMemoryTests
{
    /// <summary>Runs in the short log.</summary>
    private const int Short = 3;

    /// <summary>Runs in the long log.</summary>
    private const int Long = 15;

    /// <summary>How much more the verb may hold at its peak on the long log than on the short
    /// one, in runs read and analysed: the next run read while one is analysed, what is kept per
    /// run (report entries, names), and room for a peak the sampler missed on the short log.
    /// Keeping every run would add <see cref="Long"/> − <see cref="Short"/>.</summary>
    private const double GrowthInRuns = 4;

    /// <summary>One run as read and its analysis, both held (what a verb keeping runs keeps per run), bytes.</summary>
    private static readonly Lazy<long> OneRun = new(() =>
    {
        byte[] bytes = SimulatedLogs.Default.LogBytes;
        long before = VerbMemoryCollection.LiveBytes();
        RunAnalysis analysis = RunAnalyzer.Analyze(LogReader.Read(bytes, "one.log").Runs.Single());
        long after = VerbMemoryCollection.LiveBytes();
        GC.KeepAlive(analysis);
        return after - before;
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
    public void TheBoundCatchesAVerbThatKeepsEveryRun()
    {
        // The check can fail: the whole-session analysis, which keeps every run's analysis, grows
        // past the bound on the same logs.
        (long shortPeak, long longPeak) = Peaks((log, _, runs) =>
        {
            int analysed = SessionAnalyzer.Analyze(LogReader.ReadFile(log).Runs).Runs.Count;
            return () => Assert.Equal(runs, analysed);
        });
        Assert.True(longPeak - shortPeak > Allowed, $"keeping every run grew the peak by {longPeak - shortPeak:N0} bytes from {Short} to {Long} runs, within the bound {Allowed:N0}");
    }

    private static long Allowed => (long)(GrowthInRuns * OneRun.Value);

    private static void AssertBounded(string verb, Func<string, string, int, Action> run)
    {
        (long shortPeak, long longPeak) = Peaks(run);
        Assert.True(OneRun.Value > 1_000_000, $"one run read and analysed should be sizeable ({OneRun.Value:N0} bytes)");
        Assert.True(
            longPeak - shortPeak < Allowed,
            $"{verb} peaked at {longPeak:N0} bytes live on {Long} runs and {shortPeak:N0} on {Short}; one run read and analysed is {OneRun.Value:N0} bytes, the growth allowed {Allowed:N0}");
    }

    /// <summary>The verb's peak live heap above its start on the short log (the higher of two
    /// passes) and on the long log, after a first pass on the short log, so that what the verb
    /// sets up once is there in all.
    /// <paramref name="run"/> runs the verb and returns the checks of its output, made after the
    /// measurement (reading a long output back would count against the verb).</summary>
    private static (long Short, long Long) Peaks(Func<string, string, int, Action> run)
    {
        using var folder = new TempFolder();
        string shortLog = Season(folder, Short);
        string longLog = Season(folder, Long);
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
