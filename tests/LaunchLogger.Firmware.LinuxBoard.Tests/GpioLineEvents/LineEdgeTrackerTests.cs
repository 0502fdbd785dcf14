using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.LinuxBoard.Timing;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.GpioLineEvents;

public class LineEdgeTrackerTests
{
    private const int PickupLine = 17;
    private const int SecondLine = 27;

    // Core time zero is CLOCK_MONOTONIC 5 s here, so kernel stamps near 5e9 ns map to small µs.
    private readonly MonotonicMicrosecondCounter timeBase = new(originMicros: 5_000_000);
    private readonly HealthCounters health = new();
    private readonly EdgeObservationQueue queue;

    public LineEdgeTrackerTests()
    {
        queue = new EdgeObservationQueue(64, health);
    }

    [Fact]
    public void Consecutive_events_become_exact_edges_with_counts_from_one()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, queue, health, requestedAtMicros: 0);

        Feed(tracker, Event(5_000_100_000, PickupLine, 1), Event(5_000_200_500, PickupLine, 2), Event(5_000_300_999, PickupLine, 3));

        List<PulseObservation> got = Drain();
        Assert.Equal(3, got.Count);
        Assert.Equal((0, 1L, 99L, 100L), Tuple(got[0]));
        // 200.5 µs rounds up to 201: the edge lies in (200, 201].
        Assert.Equal((0, 2L, 200L, 201L), Tuple(got[1]));
        Assert.Equal((0, 3L, 300L, 301L), Tuple(got[2]));
        Assert.Equal(0, health.PulseObservationsDropped);
    }

    [Fact]
    public void A_line_seqno_gap_counts_the_lost_edges_and_brackets_them()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, queue, health, requestedAtMicros: 0);

        // The kernel buffer overflowed: events 3 and 4 of this line were discarded.
        Feed(tracker, Event(5_000_100_000, PickupLine, 1), Event(5_000_200_000, PickupLine, 2), Event(5_000_500_000, PickupLine, 5));

        List<PulseObservation> got = Drain();
        Assert.Equal(2, health.PulseObservationsDropped);
        Assert.Equal(4, got.Count);
        Assert.Equal((0, 2L, 199L, 200L), Tuple(got[1]));
        // Count 4 was reached somewhere after edge 2 and no later than edge 5.
        Assert.Equal((0, 4L, 200L, 500L), Tuple(got[2]));
        Assert.Equal((0, 5L, 499L, 500L), Tuple(got[3]));
        Assert.Equal(5, tracker.Count(0));
    }

    [Fact]
    public void Edges_lost_before_the_first_read_are_bracketed_from_the_request_time()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, queue, health, requestedAtMicros: 40);

        Feed(tracker, Event(5_000_100_000, PickupLine, 3));

        List<PulseObservation> got = Drain();
        Assert.Equal(2, health.PulseObservationsDropped);
        Assert.Equal((0, 2L, 40L, 100L), Tuple(got[0]));
        Assert.Equal((0, 3L, 99L, 100L), Tuple(got[1]));
    }

    [Fact]
    public void Line_seqno_wrapping_past_two_to_the_32_is_not_a_drop()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, queue, health, requestedAtMicros: 0);

        // A line that has seen 2^32 − 1 events (the first read shows them as lost, which they
        // are from this tracker's point of view); then the u32 sequence number wraps to 0 and 1.
        Feed(tracker, Event(5_001_000_000, PickupLine, uint.MaxValue));
        long dropsBeforeWrap = health.PulseObservationsDropped;
        Feed(tracker, Event(5_001_001_000, PickupLine, 0), Event(5_001_002_000, PickupLine, 1));

        Assert.Equal(dropsBeforeWrap, health.PulseObservationsDropped);
        Assert.Equal((long)uint.MaxValue + 2, tracker.Count(0));
    }

    [Fact]
    public void Two_lines_keep_their_own_counts_and_channels()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine, SecondLine }, timeBase, queue, health, requestedAtMicros: 0);

        Feed(
            tracker,
            Event(5_000_100_000, PickupLine, 1, seqno: 1),
            Event(5_000_150_000, SecondLine, 1, seqno: 2),
            Event(5_000_200_000, PickupLine, 2, seqno: 3),
            Event(5_000_250_000, SecondLine, 2, seqno: 4));

        List<PulseObservation> got = Drain();
        Assert.Equal(new[] { 0, 1, 0, 1 }, got.Select(o => o.Channel));
        Assert.Equal(new[] { 1L, 1L, 2L, 2L }, got.Select(o => o.Count));
        Assert.Equal(0, health.PulseObservationsDropped);
    }

    [Fact]
    public void Events_on_other_lines_are_ignored_and_counted()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, queue, health, requestedAtMicros: 0);

        Feed(tracker, Event(5_000_100_000, 3, 1));

        Assert.Empty(Drain());
        Assert.Equal(1, tracker.ForeignEvents);
    }

    [Fact]
    public void A_full_capture_queue_counts_its_drops_too()
    {
        var small = new EdgeObservationQueue(2, health);
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, small, health, requestedAtMicros: 0);

        for (uint s = 1; s <= 5; s++)
        {
            Feed(tracker, Event(5_000_000_000UL + (s * 1000UL), PickupLine, s));
        }

        Assert.Equal(3, health.PulseObservationsDropped);
        Assert.Equal(5, tracker.Count(0));
    }

    [Fact]
    public void Records_parsed_from_kernel_bytes_flow_through_to_observations()
    {
        var tracker = new LineEdgeTracker(new[] { PickupLine }, timeBase, queue, health, requestedAtMicros: 0);
        byte[] bytes = LineEventRecords.Build(5_000_010_000, GpioLineEvent.RisingEdge, PickupLine, 1, 1)
            .Concat(LineEventRecords.Build(5_000_020_000, GpioLineEvent.RisingEdge, PickupLine, 2, 2))
            .Concat(LineEventRecords.Build(5_000_040_000, GpioLineEvent.RisingEdge, PickupLine, 4, 4))
            .ToArray();
        var events = new GpioLineEvent[8];

        int n = GpioLineEventParser.ParseMany(bytes, events);
        for (int i = 0; i < n; i++)
        {
            tracker.OnEvent(events[i]);
        }

        Assert.Equal(new[] { 1L, 2L, 3L, 4L }, Drain().Select(o => o.Count));
        Assert.Equal(1, health.PulseObservationsDropped);
    }

    private static GpioLineEvent Event(ulong ns, int line, uint lineSeqno, uint seqno = 0)
    {
        return new GpioLineEvent(ns, GpioLineEvent.RisingEdge, (uint)line, seqno == 0 ? lineSeqno : seqno, lineSeqno);
    }

    private static void Feed(LineEdgeTracker tracker, params GpioLineEvent[] events)
    {
        foreach (GpioLineEvent e in events)
        {
            tracker.OnEvent(e);
        }
    }

    private static (int, long, long, long) Tuple(PulseObservation o) => (o.Channel, o.Count, o.LoMicros, o.HiMicros);

    private List<PulseObservation> Drain()
    {
        var list = new List<PulseObservation>();
        while (queue.TryRead(out PulseObservation o))
        {
            list.Add(o);
        }

        return list;
    }
}
