using System.Collections.Concurrent;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Builds the runs a <see cref="RunAssembler"/> closes — parsing their pulse and
/// accelerometer bodies, filtering and packing them, fitting the sample clock — on the thread
/// pool while the reader goes on with the frames after them, and hands them out in log order.</summary>
/// <remarks>
/// <para>A build depends on its own run alone (the health baseline is settled, in log order,
/// when the run closes), so each run comes out the same, bit for bit, whichever thread builds it
/// and whenever it finishes. <see cref="RunBuilding.Inline"/> builds each run as it closes, on
/// the reader's thread, as the reader did before builds moved off it.</para>
/// <para>Memory stays bounded: the reader stops for <see cref="IsFull"/> after every frame, and
/// one frame closes at most two runs, so no more than <see cref="Capacity"/> + 1 runs are held
/// between closing and being taken; each build that runs at once has buffers of its own
/// (<see cref="RunScratch"/>), kept for the next.</para>
/// <para>A build that throws does so again, as itself, when its run is taken — after every run
/// before it, where the inline build would have thrown.</para>
/// </remarks>
internal sealed class RunPipeline : IDisposable
{
    private readonly Queue<Task<Built>> pending = new();
    private readonly ConcurrentBag<RunScratch> workspaces = [];
    private readonly RunBuilding building;
    private int running;
    private int posted;
    private int taken;
    private int heldMost;

    /// <summary>A pipeline building as <paramref name="building"/> says, holding up to
    /// <paramref name="capacity"/> runs (at least 1).</summary>
    public RunPipeline(RunBuilding building, int capacity = 0)
    {
        this.building = building;
        Capacity = capacity > 0 ? capacity : DefaultCapacity;
    }

    /// <summary>Twice the cores: enough to keep every core building while the reader reads on.</summary>
    public static int DefaultCapacity { get; } = Math.Max(2, 2 * Environment.ProcessorCount);

    /// <summary>Runs held before the reader must wait for the oldest.</summary>
    public int Capacity { get; }

    /// <summary>Runs closed and not yet taken.</summary>
    public int Count => pending.Count;

    /// <summary>True when the reader should take the oldest run before reading on.</summary>
    public bool IsFull => pending.Count >= Capacity;

    /// <summary>The most runs held at once so far.</summary>
    public int HeldMost => heldMost;

    /// <summary>Builds being run at this moment.</summary>
    public int BuildsRunning => Volatile.Read(ref running);

    /// <summary>How a closed run is built: <see cref="RunBuilder.Build"/> (tests put a failure
    /// or a delay around it).</summary>
    public Func<RunBuilder, long[]?, RunScratch, DecodedRun> BuildRun { get; init; } = static (run, baseline, workspace) => run.Build(baseline, workspace);

    /// <summary>Runs posted so far (may be read from any thread).</summary>
    public int Posted => Volatile.Read(ref posted);

    /// <summary>Runs taken so far, counted once built (may be read from any thread).</summary>
    public int Taken => Volatile.Read(ref taken);

    /// <summary>Pulse and acceleration bodies that did not parse, over the runs taken so far.</summary>
    public long CorruptBodies { get; private set; }

    /// <summary>Takes a run that has just closed (the assembler's hand-off); an inline build
    /// throws here, as it did when the assembler built runs itself.</summary>
    public void Post(RunBuilder run, long[]? healthBaseline)
    {
        Interlocked.Increment(ref posted);
        pending.Enqueue(building == RunBuilding.Inline
            ? Task.FromResult(Build(run, healthBaseline))
            : Task.Run(() => Build(run, healthBaseline)));
        heldMost = Math.Max(heldMost, pending.Count);
    }

    /// <summary>True when the oldest run held is built (or its build has thrown).</summary>
    public bool OldestBuilt => pending.Count > 0 && pending.Peek().IsCompleted;

    /// <summary>Takes the oldest run, waiting for its build.</summary>
    /// <exception cref="InvalidOperationException">No run is held.</exception>
    /// <exception cref="Exception">Whatever its build threw.</exception>
    public DecodedRun Take()
    {
        // GetResult rethrows a build's own exception (not wrapped in an AggregateException).
        Built built = pending.Dequeue().GetAwaiter().GetResult();
        Interlocked.Increment(ref taken);
        CorruptBodies += built.CorruptBodies;
        return built.Run;
    }

    /// <summary>Waits for every build still running (their runs are dropped, their exceptions
    /// observed), so that no work goes on after the reader stops, and gives the buffers back.</summary>
    public void Dispose()
    {
        while (pending.Count > 0)
        {
            pending.Dequeue().ContinueWith(static t => _ = t.Exception, CancellationToken.None, TaskContinuationOptions.ExecuteSynchronously, TaskScheduler.Default).Wait();
        }

        while (workspaces.TryTake(out RunScratch? workspace))
        {
            workspace.Dispose();
        }
    }

    private Built Build(RunBuilder run, long[]? healthBaseline)
    {
        Interlocked.Increment(ref running);
        RunScratch workspace = workspaces.TryTake(out RunScratch? reused) ? reused : new RunScratch();
        try
        {
            DecodedRun built = BuildRun(run, healthBaseline, workspace);
            return new Built(built, run.CorruptBodiesAtBuild);
        }
        finally
        {
            // A long run's buffers are let go before the next build, as when runs were built inline.
            workspace.ClearAndShrink();
            workspaces.Add(workspace);
            Interlocked.Decrement(ref running);
        }
    }

    private readonly record struct Built(DecodedRun Run, long CorruptBodies);
}

/// <summary>Where <see cref="LogReader"/> builds the runs it closes.</summary>
internal enum RunBuilding
{
    /// <summary>On the thread pool, while the reader reads on (the default).</summary>
    Parallel,

    /// <summary>On the reader's thread, as each run closes.</summary>
    Inline,
}
