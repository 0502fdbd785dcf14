using System.Collections.Concurrent;
using System.Runtime.ExceptionServices;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Builds the runs a <see cref="RunAssembler"/> closes — parsing their pulse and
/// accelerometer bodies, filtering and packing them, fitting the sample clock — on other cores
/// while the reader goes on with the frames after them, and hands them out in log order.</summary>
/// <remarks>
/// <para>A build depends on its own run alone (the health baseline is settled, in log order,
/// when the run closes), so each run comes out the same, bit for bit, whichever thread builds it
/// and whenever it finishes. <see cref="RunBuilding.Inline"/> builds each run as it closes, on
/// the reader's thread, as the reader did before builds moved off it.</para>
/// <para>Threads: one builder on the thread pool per core but one takes the runs waiting, oldest
/// first, and sleeps (without spinning: the other cores are busy) while none is, until the
/// reader stops or it has been idle for <see cref="BuilderIdle"/>; the reader's thread reads
/// frames, and when it must wait for a run it builds a waiting one itself rather than sleep. So
/// as many threads work as there are cores, and no core idles while a run waits to be built.</para>
/// <para>Memory stays bounded whatever the core count: the reader stops for <see cref="IsFull"/>
/// after every frame — when <see cref="Capacity"/> runs are held (2 × cores, never more than
/// <see cref="MaxRunsAhead"/>) or when the runs held kept <see cref="BytesAhead"/> bytes of bodies
/// or more — and one frame closes at most two runs, so no more than <see cref="Capacity"/> + 1
/// runs, and no more than <see cref="BytesAhead"/> bytes plus the two largest runs, are held
/// between closing and being taken; each build that runs at once has buffers of its own
/// (<see cref="RunScratch"/>), kept for the next.</para>
/// <para>A build that throws does so again, as itself, when its run is taken — after every run
/// before it, where the inline build would have thrown.</para>
/// </remarks>
internal sealed class RunPipeline : IDisposable
{
    private readonly Queue<Job> pending = new();
    private readonly Queue<Job> waiting = new();
    private readonly object gate = new();
    private readonly ConcurrentBag<RunScratch> workspaces = [];
    private readonly RunBuilding building;
    private readonly int maxBuilders;
    private int builders;
    private bool stopped;
    private int running;
    private int posted;
    private int taken;
    private int heldMost;
    private long heldBytes;
    private long heldBytesMost;

    /// <summary>A pipeline building as <paramref name="building"/> says, holding up to
    /// <paramref name="capacity"/> runs (0: <see cref="DefaultCapacity"/>) and reading on while
    /// the runs held kept fewer than <paramref name="bytesAhead"/> bytes (0: <see cref="DefaultBytesAhead"/>).</summary>
    public RunPipeline(RunBuilding building, int capacity = 0, long bytesAhead = 0)
    {
        this.building = building;
        Capacity = capacity > 0 ? capacity : DefaultCapacity;
        BytesAhead = bytesAhead > 0 ? bytesAhead : DefaultBytesAhead;
        maxBuilders = Math.Max(1, Environment.ProcessorCount - 1);
    }

    /// <summary>A pipeline for this machine: building in parallel where there is more than one
    /// core, else inline.</summary>
    public static RunPipeline ForThisMachine() => new(Environment.ProcessorCount > 1 ? RunBuilding.Parallel : RunBuilding.Inline);

    /// <summary>How long a builder waits for another run before it ends (a reader that is left
    /// without being disposed keeps no thread).</summary>
    public static TimeSpan BuilderIdle { get; } = TimeSpan.FromSeconds(1);

    /// <summary>The most runs the reader reads ahead on any machine. One thread reads the frames
    /// for every builder, and a build takes about 1.3 times as long as reading its run
    /// (DEVELOPERS.md, "Memory at scale": frame reader ~660 MB/s, whole reader ~290 MB per
    /// CPU-second), so two or three builds at once keep up with the reader whatever the cores;
    /// eight leave room for runs that are slower to build than to read, and what is read ahead no
    /// longer grows with the cores.</summary>
    public const int MaxRunsAhead = 8;

    /// <summary>Twice the cores (enough to keep every core building while the reader reads on), at
    /// least two, at most <see cref="MaxRunsAhead"/>.</summary>
    public static int DefaultCapacity { get; } = Math.Clamp(2 * Environment.ProcessorCount, 2, MaxRunsAhead);

    /// <summary>Bytes of bodies (<see cref="RunBuilder.KeptBytes"/>, about the runs' bytes in the
    /// log) that the runs held may reach before the reader waits: 8 MiB, about twenty 30-s runs with
    /// a 1 kHz accelerometer (400 kB each) or one 13-minute run. Long runs are read ahead fewer at a
    /// time; a run longer than this is still read, alone.</summary>
    public const long DefaultBytesAhead = 8L * 1024 * 1024;

    /// <summary>Runs held before the reader must wait for the oldest.</summary>
    public int Capacity { get; }

    /// <summary>Bytes of bodies held before the reader must wait for the oldest run.</summary>
    public long BytesAhead { get; }

    /// <summary>Runs closed and not yet taken.</summary>
    public int Count => pending.Count;

    /// <summary>True when the reader should take the oldest run before reading on.</summary>
    public bool IsFull => pending.Count >= Capacity || (pending.Count > 0 && heldBytes >= BytesAhead);

    /// <summary>True when the oldest run held is built (or its build has thrown).</summary>
    public bool OldestBuilt => pending.Count > 0 && pending.Peek().Done.IsSet;

    /// <summary>The most runs held at once so far.</summary>
    public int HeldMost => heldMost;

    /// <summary>The most bytes of bodies held at once so far (runs closed and not yet taken).</summary>
    public long HeldBytesMost => heldBytesMost;

    /// <summary>Builds being run at this moment (may be read from any thread).</summary>
    public int BuildsRunning => Volatile.Read(ref running);

    /// <summary>Runs posted so far (may be read from any thread).</summary>
    public int Posted => Volatile.Read(ref posted);

    /// <summary>Runs taken so far, counted once built (may be read from any thread).</summary>
    public int Taken => Volatile.Read(ref taken);

    /// <summary>How a closed run is built: <see cref="RunBuilder.Build"/> (tests put a failure
    /// or a delay around it).</summary>
    public Func<RunBuilder, long[]?, RunScratch, DecodedRun> BuildRun { get; init; } = static (run, baseline, workspace) => run.Build(baseline, workspace);

    /// <summary>Pulse and acceleration bodies that did not parse, over the runs taken so far.</summary>
    public long CorruptBodies { get; private set; }

    /// <summary>Takes a run that has just closed (the assembler's hand-off); an inline build
    /// throws here, as it did when the assembler built runs itself.</summary>
    public void Post(RunBuilder run, long[]? healthBaseline)
    {
        Interlocked.Increment(ref posted);
        var job = new Job(run, healthBaseline, run.KeptBytes);
        if (building == RunBuilding.Inline)
        {
            Build(job);
            job.Error?.Throw();
            pending.Enqueue(job);
        }
        else
        {
            pending.Enqueue(job);
            bool startBuilder = false;
            lock (gate)
            {
                waiting.Enqueue(job);
                if (builders < maxBuilders)
                {
                    builders++;
                    startBuilder = true;
                }
                else
                {
                    Monitor.Pulse(gate);
                }
            }

            if (startBuilder)
            {
                ThreadPool.UnsafeQueueUserWorkItem(static pipeline => pipeline.BuildWaiting(), this, preferLocal: false);
            }
        }

        heldBytes += job.Bytes;
        heldMost = Math.Max(heldMost, pending.Count);
        heldBytesMost = Math.Max(heldBytesMost, heldBytes);
    }

    /// <summary>Takes the oldest run, building waiting runs meanwhile if it is not built yet.</summary>
    /// <exception cref="InvalidOperationException">No run is held.</exception>
    /// <exception cref="Exception">Whatever its build threw.</exception>
    public DecodedRun Take()
    {
        Job oldest = pending.Peek();
        while (!oldest.Done.IsSet)
        {
            if (TryClaim() is { } job)
            {
                Build(job);
            }
            else
            {
                oldest.Done.Wait();
            }
        }

        pending.Dequeue();
        heldBytes -= oldest.Bytes;
        oldest.Dispose();
        oldest.Error?.Throw();
        Interlocked.Increment(ref taken);
        CorruptBodies += oldest.Run.CorruptBodiesAtBuild;
        return oldest.Result!;
    }

    /// <summary>Waits for every build under way and drops the runs not built (their runs are
    /// dropped, their exceptions observed), so that no work goes on after the reader stops, and
    /// gives the buffers back.</summary>
    public void Dispose()
    {
        lock (gate)
        {
            stopped = true;
            Monitor.PulseAll(gate);
        }

        while (TryClaim() is { } job)
        {
            job.Run.Abandon();
            job.Done.Set();
        }

        while (pending.Count > 0)
        {
            using Job job = pending.Dequeue();
            heldBytes -= job.Bytes;
            job.Done.Wait();
        }

        while (workspaces.TryTake(out RunScratch? workspace))
        {
            workspace.Dispose();
        }
    }

    /// <summary>A builder on the thread pool: builds waiting runs, oldest first, until the
    /// reader stops or none has come for <see cref="BuilderIdle"/>.</summary>
    private void BuildWaiting()
    {
        while (true)
        {
            Job? job;
            lock (gate)
            {
                while (!waiting.TryDequeue(out job))
                {
                    if (stopped || (!Monitor.Wait(gate, BuilderIdle) && waiting.Count == 0))
                    {
                        builders--;
                        return;
                    }
                }
            }

            Build(job);
        }
    }

    private Job? TryClaim()
    {
        lock (gate)
        {
            return waiting.TryDequeue(out Job? job) ? job : null;
        }
    }

    private void Build(Job job)
    {
        Interlocked.Increment(ref running);
        RunScratch workspace = workspaces.TryTake(out RunScratch? reused) ? reused : new RunScratch();
        try
        {
            job.Result = BuildRun(job.Run, job.HealthBaseline, workspace);
        }
        catch (Exception e)
        {
            // Kept to be thrown again, as itself, when the run's turn comes.
            job.Error = ExceptionDispatchInfo.Capture(e);
        }
        finally
        {
            // A long run's buffers are let go before the next build, as when runs were built inline.
            workspace.ClearAndShrink();
            workspaces.Add(workspace);
            Interlocked.Decrement(ref running);
            job.Done.Set();
        }
    }

    /// <summary>One closed run: what it is built from, and once built, the run or the failure.</summary>
    private sealed class Job(RunBuilder run, long[]? healthBaseline, long bytes) : IDisposable
    {
        public RunBuilder Run { get; } = run;

        /// <summary>The run's bodies as kept when it closed (<see cref="RunBuilder.KeptBytes"/>).</summary>
        public long Bytes { get; } = bytes;

        public long[]? HealthBaseline { get; } = healthBaseline;

        public DecodedRun? Result { get; set; }

        public ExceptionDispatchInfo? Error { get; set; }

        /// <summary>Set once the build has ended, either way (no spinning before sleeping: the
        /// cores are busy building).</summary>
        public ManualResetEventSlim Done { get; } = new(false, spinCount: 0);

        public void Dispose() => Done.Dispose();
    }
}

/// <summary>Where <see cref="LogReader"/> builds the runs it closes.</summary>
internal enum RunBuilding
{
    /// <summary>On other cores, while the reader reads on (the default).</summary>
    Parallel,

    /// <summary>On the reader's thread, as each run closes.</summary>
    Inline,
}
