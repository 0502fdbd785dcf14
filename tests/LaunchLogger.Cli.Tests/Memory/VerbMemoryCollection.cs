using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Tests.Memory;

/// <summary>Tests that measure the process's live heap run alone: another test allocating in
/// parallel would show in their figures.</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class VerbMemoryCollection
{
    public const string Name = "verb memory ceilings";

    /// <summary>Bytes reachable after a full, blocking, compacting collection, less the reader's
    /// pool of free record chunks.</summary>
    public static long LiveBytes()
    {
        GC.Collect(2, GCCollectionMode.Forced, blocking: true, compacting: true);
        GC.WaitForPendingFinalizers();
        GC.Collect(2, GCCollectionMode.Forced, blocking: true, compacting: true);
        return Live(GC.GetGCMemoryInfo(GCKind.FullBlocking));
    }

    /// <summary>The live heap a collection left, less the chunks waiting in the reader's pool:
    /// that pool is capped (<see cref="RecordChunks{T}.MaxPooledBytes"/> per element type, however
    /// long the log) and filled by whichever let-go runs' finalizers happened to run before a
    /// sample, so counting it would measure the finalizer thread's timing, not what the verb
    /// keeps. The pool's cap is the bound DEVELOPERS.md states beside the verbs' own.</summary>
    private static long Live(GCMemoryInfo info) =>
        info.HeapSizeBytes - info.FragmentedBytes
        - ((long)(RecordChunks<uint>.PooledChunks + RecordChunks<byte>.PooledChunks) * RecordChunks<byte>.ChunkBytes);

    /// <summary>Runs <paramref name="action"/> while a second thread forces full collections over
    /// and over and records the live heap each leaves; returns the action's result and the
    /// highest live heap seen above what was live before it started (the last sample is taken
    /// after it returns, before its result is let go).</summary>
    public static (T Result, long PeakBytes) PeakLiveDuring<T>(Func<T> action)
    {
        long baseline = LiveBytes();
        long peak = 0;
        using var done = new ManualResetEventSlim();
        var sampler = new Thread(() =>
        {
            while (!done.IsSet)
            {
                // Objects waiting for their finalizers (the plot library's native wrappers) keep
                // what they reference alive for one more collection: let them go first.
                GC.Collect(2, GCCollectionMode.Forced, blocking: true);
                GC.WaitForPendingFinalizers();
                GC.Collect(2, GCCollectionMode.Forced, blocking: true);
                peak = Math.Max(peak, Live(GC.GetGCMemoryInfo(GCKind.FullBlocking)));
                done.Wait(5);
            }
        })
        { IsBackground = true };
        sampler.Start();
        T result;
        try
        {
            result = action();
        }
        finally
        {
            done.Set();
            sampler.Join();
        }

        peak = Math.Max(peak, LiveBytes());
        GC.KeepAlive(result);
        return (result, peak - baseline);
    }
}
