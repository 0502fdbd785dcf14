using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Memory;

/// <summary>A long log is read, analysed and reported one run at a time: what stays alive does
/// not grow with the number of runs, and the report is the one the whole-session path gives.</summary>
[Collection(MemoryCollection.Name)]
public class StreamedSessionMemoryTests
{
    [Fact]
    public void LiveMemoryDoesNotGrowWithTheNumberOfRunsStreamed()
    {
        // A season-like log: one simulated run's bytes repeated (each copy is a power-up of its own).
        byte[] one = Simulator.Run(BuiltInScenarios.Default, seed: 11).LogBytes;
        const int copies = 10;
        byte[] log = Repeat(one, copies);
        DecodedRun sample = LogReader.Read(one, "one.log").Runs.Single();
        long runArrays = ArrayBytes(sample);

        var live = new long[copies];
        StreamedSession<RunReport> session = SessionAnalyzer.AnalyzeEach(
            LogReader.ReadRuns(new MemoryStream(log), "season.log"),
            (analysis, index) =>
            {
                live[index - 1] = MemoryCollection.LiveBytes();
                return RunReportBuilder.Build(analysis, index);
            });

        Assert.Equal(copies, session.Runs.Count);

        // Kept whole, each run would add at least its decoded arrays (and its reconstruction); streamed,
        // eight more runs add less than one run's arrays: what is kept per run is its report entry.
        long growth = live[^1] - live[1];
        Assert.True(runArrays > 500_000, $"the sample run should be a sizeable one ({runArrays:N0} bytes of arrays)");
        Assert.True(growth < runArrays, $"live memory grew {growth:N0} bytes over {copies - 2} runs; one run's arrays are {runArrays:N0} bytes");
    }

    [Fact]
    public void LetGoRunsGiveTheirLargeArraysToTheRunsAfterThem()
    {
        // 24 runs with a 1 kHz accelerometer, each holding about half a megabyte of packed pulses
        // and samples (large objects). Kept, every run needs its own; streamed and let go (a
        // collection after each, as the collector would make in time), the runs after the first
        // few take the chunks the earlier ones gave back.
        Scenario scenario = KilohertzRuns.Driven(900);
        byte[] one = Simulator.Run(scenario, seed: 3).LogBytes;
        const int copies = 24;
        byte[] log = Repeat(one, copies);
        DecodedRun sample = LogReader.Read(one, "one.log").Runs.Single();
        long packedBytes = (12L * (sample.Pulses.Count + sample.SecondPulses.Count)) + (6L * sample.Accel!.Count); // 12 bytes a pulse, 6 a sample
        Assert.True(packedBytes > 4 * RecordChunks<byte>.ChunkBytes, $"the sample run should hold several chunks ({packedBytes:N0} bytes)");

        MemoryCollection.LiveBytes();
        long before = GC.GetTotalAllocatedBytes(precise: true);
        int kept = LogReader.Read(log, "kept.log").Runs.Count;
        long keptAllocated = GC.GetTotalAllocatedBytes(precise: true) - before;

        MemoryCollection.LiveBytes();
        before = GC.GetTotalAllocatedBytes(precise: true);
        int streamed = 0;
        foreach (DecodedRun run in LogReader.ReadRuns(new MemoryStream(log), "streamed.log"))
        {
            streamed += run.Accel!.Count > 0 ? 1 : 0;
            MemoryCollection.LiveBytes();
        }

        long streamedAllocated = GC.GetTotalAllocatedBytes(precise: true) - before;

        Assert.Equal(copies, kept);
        Assert.Equal(copies, streamed);
        Assert.True(keptAllocated >= copies * packedBytes, $"kept, {copies} runs allocated {keptAllocated:N0} bytes; their packed data alone is {copies * packedBytes:N0}");
        // At least half the runs took their chunks from runs let go before them (the first few
        // are read while none has been let go: the reader builds runs ahead).
        long saved = keptAllocated - streamedAllocated;
        Assert.True(saved >= copies / 2 * packedBytes, $"streamed, {copies} runs allocated {streamedAllocated:N0} bytes, kept {keptAllocated:N0}: {saved:N0} saved, less than half their packed data ({copies / 2 * packedBytes:N0})");
    }

    [Fact]
    public void StreamingGivesTheSameReportAsTheWholeSession()
    {
        // A launch, a stop at the grip limit (which bounds the launch) and the launch again: the
        // bound found in the second run must reach the first run's verdict too.
        byte[] launch = Simulator.Run(BuiltInScenarios.Default, seed: 4).LogBytes;
        byte[] stop = Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed: 4).LogBytes;
        byte[] log = [.. launch, .. stop, .. launch];

        SessionAnalysis whole = SessionAnalyzer.Analyze(LogReader.Read(log, "mixed.log").Runs);
        StreamedSession<RunReport> streamed = SessionAnalyzer.AnalyzeEach(
            LogReader.ReadRuns(new MemoryStream(log), "mixed.log"), (analysis, index) => RunReportBuilder.Build(analysis, index));

        Assert.NotNull(whole.Bound);
        string expected = ReportJson.Serialize(RunReportBuilder.Document(whole, "test", "mixed.log", null, null, [(1, 3)]));
        string actual = ReportJson.Serialize(RunReportBuilder.Document(streamed, "test", "mixed.log", null, null, [(1, 3)]));
        Assert.Equal(expected, actual);
    }

    [Fact]
    public void AStreamedLogHandsOutTheSameRunsAndCountersAsAWholeRead()
    {
        byte[] one = Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 2).LogBytes;
        byte[] log = Repeat(one, 3);

        LogReadResult whole = LogReader.Read(log, "three.log");
        LogReadResult? end = null;
        List<DecodedRun> streamed = [.. LogReader.ReadRuns(new MemoryStream(log), "three.log", r => end = r)];

        Assert.NotNull(end);
        Assert.Empty(end!.Runs);
        Assert.Equal(whole.Stats, end.Stats);
        Assert.Equal(whole.Warnings, end.Warnings);
        Assert.Equal(whole.Runs.Count, streamed.Count);
        for (int i = 0; i < streamed.Count; i++)
        {
            Assert.Equal(whole.Runs[i].Source, streamed[i].Source);
            Assert.Equal(whole.Runs[i].Pulses, streamed[i].Pulses);
            Assert.Equal(whole.Runs[i].Accel!.ForwardMps2, streamed[i].Accel!.ForwardMps2);
            Assert.Equal(whole.Runs[i].Warnings, streamed[i].Warnings);
        }
    }

    private static byte[] Repeat(byte[] one, int copies)
    {
        var log = new byte[one.Length * copies];
        for (int i = 0; i < copies; i++)
        {
            one.CopyTo(log, i * one.Length);
        }

        return log;
    }

    /// <summary>Bytes of a decoded run's per-observation arrays.</summary>
    internal static long ArrayBytes(DecodedRun run)
    {
        long pulses = (run.Pulses.Count + run.SecondPulses.Count) * 24L; // count, lo, hi: 3 × 8 bytes
        long accel = run.Accel is { } a ? a.Count * (4L * sizeof(double) + (a.SampleIndex is null ? 0 : sizeof(long))) : 0;
        return pulses + accel;
    }
}
