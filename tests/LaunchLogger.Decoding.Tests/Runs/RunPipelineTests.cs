using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Tests.Shared;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>Runs built on the thread pool while the reader reads on: the same runs, counters and
/// warnings as built one after the other on the reader's thread (the reference), in log order
/// whatever order the builds finish in, a bounded number held, and stops and failures as before.</summary>
public class RunPipelineTests
{
    /// <summary>Longest a test waits for another thread before it fails (a guard against a hang, not a timing).</summary>
    private static readonly TimeSpan Guard = TimeSpan.FromMinutes(2);

    /// <summary>Six power-ups of three scenarios, one run each.</summary>
    private static readonly Lazy<byte[]> SixRuns = new(() =>
    {
        byte[] a = Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 3).LogBytes;
        byte[] b = Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed: 3).LogBytes;
        byte[] c = Simulator.Run(BuiltInScenarios.Default, seed: 3).LogBytes;
        return [.. a, .. b, .. c, .. a, .. b, .. c];
    });

    [Fact]
    public void RunsComeOutInLogOrderWhenALaterBuildFinishesFirst()
    {
        byte[] log = SixRuns.Value;
        LogReadResult reference = LogReader.Read(log, "six.log", new RunPipeline(RunBuilding.Inline));
        string first = reference.Runs[0].Source;
        string second = reference.Runs[1].Source;
        using var secondBuilt = new ManualResetEventSlim();
        var finished = new List<string>();
        var pipeline = new RunPipeline(RunBuilding.Parallel, capacity: 4)
        {
            BuildRun = (run, baseline, workspace) =>
            {
                // The first run's build waits until the second's is done.
                if (run.Source == first && !secondBuilt.Wait(Guard))
                {
                    throw new TimeoutException("the second run's build never finished");
                }

                DecodedRun built = run.Build(baseline, workspace);
                lock (finished)
                {
                    finished.Add(run.Source);
                }

                if (run.Source == second)
                {
                    secondBuilt.Set();
                }

                return built;
            },
        };

        LogReadResult parallel = LogReader.Read(log, "six.log", pipeline);

        Assert.Equal(6, reference.Runs.Select(r => r.Source).Distinct().Count());
        Assert.True(finished.IndexOf(second) < finished.IndexOf(first), "the second run's build should finish before the first's");
        Assert.Equal(RunFingerprint.Of(reference), RunFingerprint.Of(parallel));
    }

    [Fact]
    public void TheStreamedReadGivesTheSameRunsCountersAndWarningsAsTheInlineOne()
    {
        byte[] log = SixRuns.Value;
        LogReadResult reference = LogReader.Read(log, "six.log", new RunPipeline(RunBuilding.Inline));
        LogReadResult? end = null;
        List<DecodedRun> streamed = [.. LogReader.ReadRuns(new MemoryStream(log), "six.log", new RunPipeline(RunBuilding.Parallel), r => end = r)];

        Assert.NotNull(end);
        Assert.Equal(RunFingerprint.Of(reference), RunFingerprint.Of(end!.Source, streamed, end.Stats, end.Warnings));
    }

    [Theory]
    [InlineData("in memory")]
    [InlineData("streamed")]
    public void NoMoreThanCapacityPlusOneRunsAreHeldAndTheBoundIsReached(string path)
    {
        byte[] log = SixRuns.Value;
        LogReadResult reference = LogReader.Read(log, "six.log", new RunPipeline(RunBuilding.Inline));
        RunPipeline pipeline = null!;
        pipeline = new RunPipeline(RunBuilding.Parallel, capacity: 2)
        {
            BuildRun = FirstWaitsUntil(reference.Runs[0].Source, () => pipeline.Posted - pipeline.Taken >= 2),
        };

        string read = ReadThrough(path, log, pipeline);

        Assert.InRange(pipeline.HeldMost, 2, pipeline.Capacity + 1);
        Assert.Equal(6, pipeline.Taken);
        Assert.Equal(RunFingerprint.Of(reference), read);
    }

    [Theory]
    [InlineData("in memory")]
    [InlineData("streamed")]
    public void TheReaderWaitsOnceTheRunsHeldKeepTheBytesAheadAndTheBoundIsReached(string path)
    {
        // Room for six runs by count, but bytes for about two of the six: the byte bound, not
        // the count, stops the reader, and the runs still come out whole and in order.
        byte[] log = SixRuns.Value;
        LogReadResult reference = LogReader.Read(log, "six.log", new RunPipeline(RunBuilding.Inline));
        var kept = new Dictionary<string, long>();
        LogReader.Read(log, "six.log", new RunPipeline(RunBuilding.Inline)
        {
            BuildRun = (run, baseline, workspace) =>
            {
                kept[run.Source] = run.KeptBytes;
                return run.Build(baseline, workspace);
            },
        });
        long bytesAhead = kept.Values.Sum() / 3;
        long largestTwo = kept.Values.OrderDescending().Take(2).Sum();
        RunPipeline pipeline = null!;
        pipeline = new RunPipeline(RunBuilding.Parallel, capacity: 6, bytesAhead: bytesAhead)
        {
            // Until the reader stops for the bytes (or, were the bound broken, has read every run).
            BuildRun = FirstWaitsUntil(reference.Runs[0].Source, () => pipeline.IsFull || pipeline.Posted == 6),
        };

        string read = ReadThrough(path, log, pipeline);

        Assert.Equal(6, kept.Count);
        Assert.InRange(pipeline.HeldBytesMost, bytesAhead, bytesAhead + largestTwo - 1);
        Assert.InRange(pipeline.HeldMost, 1, 5);
        Assert.Equal(6, pipeline.Taken);
        Assert.Equal(RunFingerprint.Of(reference), read);
    }

    [Fact]
    public void TheDefaultReadAheadDoesNotGrowWithTheCores()
    {
        // Whatever DOTNET_PROCESSOR_COUNT says, a pipeline for this machine holds at most
        // MaxRunsAhead runs and reads on only below DefaultBytesAhead (the verbs' memory tests
        // size their logs by these figures, DEVELOPERS.md "Memory at scale").
        using RunPipeline pipeline = RunPipeline.ForThisMachine();

        Assert.InRange(pipeline.Capacity, 2, RunPipeline.MaxRunsAhead);
        Assert.Equal(RunPipeline.DefaultBytesAhead, pipeline.BytesAhead);
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void ABuildThatThrowsSurfacesAsItselfAfterTheRunsBeforeIt(bool parallel)
    {
        RunBuilding building = parallel ? RunBuilding.Parallel : RunBuilding.Inline;
        byte[] log = SixRuns.Value;
        string[] sources = [.. LogReader.Read(log, "six.log").Runs.Select(r => r.Source)];
        var pipeline = new RunPipeline(building)
        {
            BuildRun = (run, baseline, workspace) => run.Source == sources[2]
                ? throw new InvalidDataException("this run cannot be built")
                : run.Build(baseline, workspace),
        };
        var received = new List<string>();

        InvalidDataException thrown = Assert.Throws<InvalidDataException>(() =>
        {
            foreach (DecodedRun run in LogReader.ReadRuns(new MemoryStream(log), "six.log", pipeline))
            {
                received.Add(run.Source);
            }
        });

        Assert.Equal("this run cannot be built", thrown.Message);
        Assert.Equal(sources[..2], received);
        Assert.Equal(0, pipeline.BuildsRunning);
        Assert.Equal(0, pipeline.Count);
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void CancellingHandsOutTheRunsClosedBeforeItThenStopsWithNoBuildLeft(bool parallel)
    {
        RunBuilding building = parallel ? RunBuilding.Parallel : RunBuilding.Inline;
        byte[] log = SixRuns.Value;
        string[] sources = [.. LogReader.Read(log, "six.log").Runs.Select(r => r.Source)];
        using var cancel = new CancellationTokenSource();
        var pipeline = new RunPipeline(building);
        var received = new List<string>();

        Assert.Throws<OperationCanceledException>(() =>
        {
            foreach (DecodedRun run in LogReader.ReadRuns(new MemoryStream(log), "six.log", pipeline, cancellationToken: cancel.Token))
            {
                received.Add(run.Source);
                cancel.Cancel();
            }
        });

        // Stopped between blocks: what came out is the log's first runs, in order, and not all of them.
        Assert.InRange(received.Count, 1, sources.Length - 1);
        Assert.Equal(sources[..received.Count], received);
        Assert.Equal(0, pipeline.BuildsRunning);
        Assert.Equal(0, pipeline.Count);
    }

    [Fact]
    public void LeavingTheRunsEarlyWaitsForTheBuildsUnderWay()
    {
        byte[] log = SixRuns.Value;
        var pipeline = new RunPipeline(RunBuilding.Parallel, capacity: 3);

        DecodedRun first = LogReader.ReadRuns(new MemoryStream(log), "six.log", pipeline).First();

        Assert.Equal(LogReader.Read(log, "six.log").Runs[0].Source, first.Source);
        Assert.Equal(0, pipeline.BuildsRunning);
        Assert.Equal(0, pipeline.Count);
    }

    /// <summary>Builds runs as the reader does, but the build of the run from
    /// <paramref name="firstSource"/> waits until <paramref name="filled"/> (the reader has filled
    /// the pipeline), so that the bound under test is met.</summary>
    private static Func<RunBuilder, long[]?, RunScratch, DecodedRun> FirstWaitsUntil(string firstSource, Func<bool> filled) => (run, baseline, workspace) =>
    {
        if (run.Source == firstSource && !SpinWait.SpinUntil(filled, Guard))
        {
            throw new TimeoutException("the reader never filled the pipeline");
        }

        return run.Build(baseline, workspace);
    };

    /// <summary>The fingerprint of <paramref name="log"/> read through <paramref name="pipeline"/>,
    /// whole in memory or streamed as <paramref name="path"/> says.</summary>
    private static string ReadThrough(string path, byte[] log, RunPipeline pipeline)
    {
        if (path == "in memory")
        {
            return RunFingerprint.Of(LogReader.Read(log, "six.log", pipeline));
        }

        LogReadResult? end = null;
        List<DecodedRun> runs = [.. LogReader.ReadRuns(new MemoryStream(log), "six.log", pipeline, r => end = r)];
        return RunFingerprint.Of(end!.Source, runs, end.Stats, end.Warnings);
    }
}
