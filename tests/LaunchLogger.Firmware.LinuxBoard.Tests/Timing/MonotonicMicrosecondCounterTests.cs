using System.Diagnostics;
using System.Runtime.InteropServices;
using LaunchLogger.Firmware.LinuxBoard.Timing;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Timing;

public partial class MonotonicMicrosecondCounterTests
{
    private const int ClockMonotonic = 1; // CLOCK_MONOTONIC in linux/time.h

    [Fact]
    public void Stopwatch_reads_the_same_clock_as_clock_gettime_monotonic()
    {
        // struct timespec on 64-bit Linux is two 64-bit fields; this test runs on x86-64/arm64.
        Assert.Equal(8, IntPtr.Size);
        Assert.Equal(1_000_000_000, Stopwatch.Frequency);
        for (int i = 0; i < 100; i++)
        {
            long before = ClockGetTimeNanos();
            long stopwatch = MonotonicMicrosecondCounter.NowMonotonicNanos();
            long after = ClockGetTimeNanos();
            Assert.InRange(stopwatch, before, after);
        }
    }

    [Fact]
    public void Counter_starts_near_zero_and_never_runs_behind_an_edge_stamped_earlier()
    {
        var counter = new MonotonicMicrosecondCounter();
        ulong edgeNs = (ulong)ClockGetTimeNanos();
        uint later = counter.ReadMicros32();

        Assert.True(counter.EdgeMicros(edgeNs) <= later);
        Assert.True(counter.EdgeMicros(edgeNs) >= 0);
    }

    [Theory]
    [InlineData("on a microsecond", 7_000_000UL, 2_000)]
    [InlineData("just after one", 7_000_001UL, 2_001)]
    [InlineData("just before the next", 7_000_999UL, 2_001)]
    public void Edge_times_round_up_so_the_edge_lies_inside_its_bracket(string name, ulong ns, long expectedMicros)
    {
        _ = name;
        var counter = new MonotonicMicrosecondCounter(originMicros: 5_000);

        long micros = counter.EdgeMicros(ns);

        Assert.Equal(expectedMicros, micros);
        double trueMicros = (ns / 1000.0) - 5_000;
        Assert.True(trueMicros > micros - 1 && trueMicros <= micros);
    }

    private static long ClockGetTimeNanos()
    {
        Assert.Equal(0, ClockGetTime(ClockMonotonic, out TimeSpec ts));
        return (ts.Seconds * 1_000_000_000L) + ts.Nanoseconds;
    }

    [LibraryImport("libc", EntryPoint = "clock_gettime")]
    private static partial int ClockGetTime(int clock, out TimeSpec time);

    [StructLayout(LayoutKind.Sequential)]
    private struct TimeSpec
    {
        public long Seconds;
        public long Nanoseconds;
    }
}
