using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.LinuxBoard.Timing;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>Turns kernel line events into pulse observations: one exact edge per event (a one
/// microsecond bracket), cumulative counts per channel, and kernel-side drops detected from gaps
/// in each line's <c>line_seqno</c>.</summary>
/// <remarks>
/// <para>The count of a channel is the line's event sequence number since the request was made,
/// extended past 2^32. So when the kernel's event buffer overflows (it discards the oldest events,
/// which keep their sequence numbers) the count stays right: the next surviving event jumps by the
/// number lost. The lost edges are counted in <see cref="HealthCounters.PulseObservationsDropped"/>
/// and, so the log says where they went, written as one wide observation "count reached N−1 in
/// (previous edge, this edge]" ahead of the exact one.</para>
/// <para>Used from the single reader thread; the queue it feeds is the thread-safe hand-over to
/// the capture loop.</para>
/// </remarks>
public sealed class LineEdgeTracker
{
    private readonly uint[] lineOffsets;
    private readonly MonotonicMicrosecondCounter timeBase;
    private readonly EdgeObservationQueue queue;
    private readonly HealthCounters health;
    private readonly ChannelState[] channels;

    /// <summary>Tracks the lines in <paramref name="lineOffsets"/>; index = pulse channel.</summary>
    /// <param name="lineOffsets">Line offset of channel 0, then channel 1 if wired.</param>
    /// <param name="timeBase">Maps kernel timestamps to the core's microseconds.</param>
    /// <param name="queue">Where observations go.</param>
    /// <param name="health">Where drops are counted.</param>
    /// <param name="requestedAtMicros">Core time when the lines were requested: the start of the
    /// bracket for edges lost before the first event was read.</param>
    public LineEdgeTracker(ReadOnlySpan<int> lineOffsets, MonotonicMicrosecondCounter timeBase, EdgeObservationQueue queue, HealthCounters health, long requestedAtMicros)
    {
        ArgumentNullException.ThrowIfNull(timeBase);
        ArgumentNullException.ThrowIfNull(queue);
        ArgumentNullException.ThrowIfNull(health);
        if (lineOffsets.Length < 1 || lineOffsets.Length > 2)
        {
            throw new ArgumentException("one or two pulse lines", nameof(lineOffsets));
        }

        this.lineOffsets = new uint[lineOffsets.Length];
        channels = new ChannelState[lineOffsets.Length];
        for (int i = 0; i < lineOffsets.Length; i++)
        {
            this.lineOffsets[i] = (uint)lineOffsets[i];
            channels[i].LastEdgeMicros = requestedAtMicros;
        }

        this.timeBase = timeBase;
        this.queue = queue;
        this.health = health;
    }

    /// <summary>Events on lines this tracker was not asked about (never expected).</summary>
    public long ForeignEvents { get; private set; }

    /// <summary>The cumulative count of a channel so far.</summary>
    public long Count(int channel)
    {
        return channels[channel].Count;
    }

    /// <summary>Takes one event, in the order the kernel delivered it.</summary>
    public void OnEvent(in GpioLineEvent lineEvent)
    {
        int channel = ChannelOf(lineEvent.Offset);
        if (channel < 0)
        {
            ForeignEvents++;
            return;
        }

        ref ChannelState state = ref channels[channel];

        // line_seqno starts at 1 with the first event after the request; unsigned subtraction
        // steps over its wrap at 2^32.
        long advance = state.SeqnoKnown ? unchecked(lineEvent.LineSeqno - state.LastSeqno) : lineEvent.LineSeqno;
        if (advance == 0)
        {
            return;
        }

        long edgeMicros = timeBase.EdgeMicros(lineEvent.TimestampNs);
        if (advance > 1)
        {
            long lost = advance - 1;
            Interlocked.Add(ref health.PulseObservationsDropped, lost);
            long lo = state.LastEdgeMicros;
            if (edgeMicros > lo)
            {
                queue.TryWrite(channel, state.Count + lost, lo, edgeMicros);
            }
        }

        state.Count += advance;
        state.LastSeqno = lineEvent.LineSeqno;
        state.SeqnoKnown = true;
        if (edgeMicros > state.LastEdgeMicros)
        {
            state.LastEdgeMicros = edgeMicros;
        }

        queue.TryWriteEdge(channel, state.Count, edgeMicros);
    }

    private int ChannelOf(uint offset)
    {
        for (int i = 0; i < lineOffsets.Length; i++)
        {
            if (lineOffsets[i] == offset)
            {
                return i;
            }
        }

        return -1;
    }

    private struct ChannelState
    {
        public bool SeqnoKnown;
        public uint LastSeqno;
        public long Count;
        public long LastEdgeMicros;
    }
}
