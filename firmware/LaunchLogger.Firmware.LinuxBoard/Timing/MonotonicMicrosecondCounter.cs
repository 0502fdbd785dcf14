using System.Diagnostics;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Timing;

/// <summary>The box's microsecond counter on Linux: CLOCK_MONOTONIC, the clock the kernel also
/// stamps GPIO line events with, counted from the moment this object was made.</summary>
/// <remarks>
/// <para>Read through <see cref="Stopwatch.GetTimestamp"/>. On Linux that is
/// <c>clock_gettime(CLOCK_MONOTONIC)</c> in nanoseconds with <see cref="Stopwatch.Frequency"/>
/// = 10^9 (dotnet/runtime: Stopwatch.Unix.cs → SystemNative_GetTimestamp → minipal_hires_ticks in
/// src/native/minipal/time.c). Using it avoids declaring <c>struct timespec</c>, whose field
/// widths differ between 32- and 64-bit boards; the constructor refuses any other frequency,
/// and a test compares it with <c>clock_gettime</c> called directly.</para>
/// <para>The core's <see cref="LaunchLogger.Firmware.Clock.MonotonicClock"/> extends the low 32 bits read here, starting
/// from this object's origin, so core time = CLOCK_MONOTONIC µs − <see cref="OriginMicros"/>.
/// <see cref="EdgeMicros"/> maps a kernel event timestamp onto that same time line.</para>
/// </remarks>
public sealed class MonotonicMicrosecondCounter : IMicrosecondCounter
{
    private const long NanosPerMicro = 1000;

    /// <summary>Starts counting from now.</summary>
    /// <exception cref="PlatformNotSupportedException">The runtime's timestamp is not the
    /// nanosecond monotonic clock (not Linux).</exception>
    public MonotonicMicrosecondCounter()
        : this(NowMonotonicNanos() / NanosPerMicro)
    {
    }

    /// <summary>Counts from a given CLOCK_MONOTONIC time (µs): for tests and replay.</summary>
    public MonotonicMicrosecondCounter(long originMicros)
    {
        OriginMicros = originMicros;
    }

    /// <summary>The CLOCK_MONOTONIC time (µs) that the core's clock calls zero.</summary>
    public long OriginMicros { get; }

    /// <summary>Reads CLOCK_MONOTONIC in nanoseconds.</summary>
    /// <exception cref="PlatformNotSupportedException">The runtime's timestamp is not in nanoseconds.</exception>
    public static long NowMonotonicNanos()
    {
        if (Stopwatch.Frequency != 1_000_000_000)
        {
            throw new PlatformNotSupportedException(
                "Stopwatch does not count CLOCK_MONOTONIC nanoseconds here (frequency " + Stopwatch.Frequency + "); this program needs Linux");
        }

        return Stopwatch.GetTimestamp();
    }

    /// <inheritdoc/>
    public uint ReadMicros32()
    {
        return unchecked((uint)((NowMonotonicNanos() / NanosPerMicro) - OriginMicros));
    }

    /// <summary>The core time (µs) of an edge the kernel stamped at <paramref name="timestampNs"/>
    /// (CLOCK_MONOTONIC ns), rounded up: the edge then lies in (result − 1, result], the one-tick
    /// bracket that <c>EdgeObservationQueue.TryWriteEdge</c> writes.</summary>
    public long EdgeMicros(ulong timestampNs)
    {
        long ceilingMicros = (long)((timestampNs + (NanosPerMicro - 1)) / NanosPerMicro);
        return ceilingMicros - OriginMicros;
    }
}
