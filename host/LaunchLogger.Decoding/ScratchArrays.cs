using System.Buffers;
using System.Runtime.CompilerServices;

namespace LaunchLogger.Decoding;

/// <summary>Short-lived working arrays: small ones from <see cref="ArrayPool{T}.Shared"/>, large
/// ones (over <see cref="MaxPooledBytes"/>) fresh from the collector.</summary>
/// <remarks>The shared pool keeps every array it gets back for the life of the process. A long
/// run's working arrays run to hundreds of megabytes (the smoother's states of a 30-minute run
/// are 150 MB); pooled, they would stay after the run as dead weight, so that memory would be
/// bounded by the sum of the largest arrays ever used rather than by the run at hand. Only for
/// element types without references (pooled arrays are not cleared when given back). Contents
/// are not cleared on renting either.</remarks>
internal static class ScratchArrays
{
    /// <summary>The largest array taken from and given back to the shared pool, bytes.</summary>
    public const int MaxPooledBytes = 1 << 20;

    /// <summary>An array of at least <paramref name="length"/> elements, contents undefined.</summary>
    public static T[] Rent<T>(int length) =>
        (long)length * Unsafe.SizeOf<T>() <= MaxPooledBytes ? ArrayPool<T>.Shared.Rent(length) : GC.AllocateUninitializedArray<T>(length);

    /// <summary>Gives back an array from <see cref="Rent{T}"/>: a small one to the pool, a large
    /// one to the collector.</summary>
    public static void Return<T>(T[] array)
    {
        if (array.Length > 0 && (long)array.Length * Unsafe.SizeOf<T>() <= MaxPooledBytes)
        {
            ArrayPool<T>.Shared.Return(array);
        }
    }
}
