using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Tests.Shared;

namespace LaunchLogger.Cli.Tests;

/// <summary>The robustness benchmark's seeded damaged logs read with each run built on the
/// thread pool while the reader reads on give what building them one after the other on the
/// reader's thread gives — runs, counters and warnings alike — in memory and streamed, with room
/// for many runs at once and for as few as two.</summary>
public class ParallelReadingTests
{
    public static TheoryData<int> Cases()
    {
        // Six cases of every kind of damage (the kinds take turns).
        var cases = new TheoryData<int>();
        int kinds = Enum.GetValues<RobustnessBenchmark.Kind>().Length;
        for (int first = 0; first < 6 * kinds; first += kinds)
        {
            cases.Add(first);
        }

        return cases;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void DamagedLogsReadInParallelGiveWhatTheInlineReadGives(int firstCase)
    {
        IReadOnlyList<byte[]> bases = RobustnessBenchmark.BaseLogs(seed: 5);
        for (int index = firstCase; index < firstCase + Enum.GetValues<RobustnessBenchmark.Kind>().Length; index++)
        {
            (byte[] log, RobustnessBenchmark.Kind kind) = RobustnessBenchmark.DamagedLog(bases, seed: 5, index);
            string reference = RunFingerprint.Of(LogReader.Read(log, "case.log", new RunPipeline(RunBuilding.Inline)));
            foreach (int capacity in new[] { 0, 2 })
            {
                string inMemory = RunFingerprint.Of(LogReader.Read(log, "case.log", new RunPipeline(RunBuilding.Parallel, capacity)));
                LogReadResult? end = null;
                List<DecodedRun> runs = [.. LogReader.ReadRuns(new MemoryStream(log), "case.log", new RunPipeline(RunBuilding.Parallel, capacity), r => end = r)];
                string streamed = RunFingerprint.Of(end!.Source, runs, end.Stats, end.Warnings);

                Assert.True(reference == inMemory, $"case {index} ({kind}), capacity {capacity}: the in-memory read differs");
                Assert.True(reference == streamed, $"case {index} ({kind}), capacity {capacity}: the streamed read differs");
            }
        }
    }
}
