using LaunchLogger.Decoding.Reading;

namespace LaunchLogger.Decoding.Runs;

/// <summary>The growable buffers one open run collects into, owned by the assembler and
/// reused by each run in turn: only one run is open at a time, and building it copies
/// everything out into arrays of their final size.</summary>
internal sealed class RunScratch : IDisposable
{
    /// <summary>Pulse observations of channel 0, as read.</summary>
    public PooledBuffer<PulseMicros> Channel0 { get; } = new(1024);

    /// <summary>Pulse observations of channel 1, as read.</summary>
    public PooledBuffer<PulseMicros> Channel1 { get; } = new(16);

    /// <summary>One entry per acceleration frame.</summary>
    public PooledBuffer<AccelFrame> AccelFrames { get; } = new(256);

    /// <summary>One entry per burst, made when the run is built.</summary>
    public PooledBuffer<BurstReading> Bursts { get; } = new(256);

    /// <summary>The burst each acceleration frame belongs to, made when the run is built.</summary>
    public PooledBuffer<int> BurstOfFrame { get; } = new(256);

    /// <summary>Empties every buffer for the next run.</summary>
    public void Clear()
    {
        Channel0.Clear();
        Channel1.Clear();
        AccelFrames.Clear();
        Bursts.Clear();
        BurstOfFrame.Clear();
    }

    /// <summary>Empties every buffer, letting go of those a long run made too large to pool.</summary>
    public void ClearAndShrink()
    {
        Channel0.ClearAndShrink();
        Channel1.ClearAndShrink();
        AccelFrames.ClearAndShrink();
        Bursts.ClearAndShrink();
        BurstOfFrame.ClearAndShrink();
    }

    public void Dispose()
    {
        Channel0.Dispose();
        Channel1.Dispose();
        AccelFrames.Dispose();
        Bursts.Dispose();
        BurstOfFrame.Dispose();
    }

    /// <summary>An acceleration frame's header and where its samples (as written: x, y, z as
    /// i16 LE) lie among the run's kept bodies (<see cref="RawFrames.Bytes"/>).</summary>
    /// <param name="ReadMicros">When the box read the burst, µs.</param>
    /// <param name="FirstIndex">The sensor's index of the frame's first sample.</param>
    /// <param name="Count">Samples in the frame.</param>
    /// <param name="Chunk">The kept chunk holding the samples.</param>
    /// <param name="ByteOffset">Where in that chunk the first sample starts.</param>
    public readonly record struct AccelFrame(long ReadMicros, long FirstIndex, int Count, int Chunk, int ByteOffset);
}
