namespace LaunchLogger.Decoding.Tests.Memory;

/// <summary>Tests that read the process's live heap (GC.GetTotalMemory after a full collection)
/// run alone: another test allocating in parallel would show in their figures.</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class MemoryCollection
{
    public const string Name = "memory ceilings";

    /// <summary>Bytes reachable after a full, compacting collection.</summary>
    public static long LiveBytes()
    {
        GC.Collect(2, GCCollectionMode.Forced, blocking: true, compacting: true);
        GC.WaitForPendingFinalizers();
        return GC.GetTotalMemory(forceFullCollection: true);
    }
}
