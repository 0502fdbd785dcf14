namespace LaunchLogger.Cli.Tests.Memory;

/// <summary>Tests that measure the process's live heap run alone: another test allocating in
/// parallel would show in their figures.</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class VerbMemoryCollection
{
    public const string Name = "verb memory ceilings";

    /// <summary>Bytes reachable after a full, blocking, compacting collection.</summary>
    public static long LiveBytes()
    {
        GC.Collect(2, GCCollectionMode.Forced, blocking: true, compacting: true);
        GC.WaitForPendingFinalizers();
        GC.Collect(2, GCCollectionMode.Forced, blocking: true, compacting: true);
        return GC.GetGCMemoryInfo(GCKind.FullBlocking).HeapSizeBytes - GC.GetGCMemoryInfo(GCKind.FullBlocking).FragmentedBytes;
    }

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
                GCMemoryInfo info = GC.GetGCMemoryInfo(GCKind.FullBlocking);
                peak = Math.Max(peak, info.HeapSizeBytes - info.FragmentedBytes);
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
