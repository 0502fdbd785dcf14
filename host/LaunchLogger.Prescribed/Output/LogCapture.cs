using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Output;

/// <summary>How the box sees the pulses when it writes a log: each edge timestamped
/// (<see cref="Edges"/> set), or a hardware counter polled by its loop (<see cref="Polled"/> set).</summary>
public sealed record LogCapture
{
    /// <summary>Edge timestamps (interrupt or line events), or null.</summary>
    public EdgeTiming? Edges { get; init; }

    /// <summary>The polling loop, or null.</summary>
    public PolledCounter? Polled { get; init; }

    /// <summary>Loop period when edges are timestamped, s.</summary>
    public double EdgeLoopPeriodS { get; init; } = 1e-3;

    /// <summary>1-σ of that loop's period as a fraction of it. A loop that also writes frames
    /// never keeps time exactly; without jitter its accelerometer reads would stay locked to the
    /// sample clock's phase, which no real box does.</summary>
    public double EdgeLoopJitterFraction { get; init; } = 0.3;

    /// <summary>Edge timestamps with 1 µs resolution, read every millisecond.</summary>
    public static LogCapture ExactEdges { get; } = new() { Edges = new EdgeTiming() };

    /// <summary>A counter polled every <paramref name="periodS"/>.</summary>
    public static LogCapture PolledEvery(double periodS, double jitterFraction = 0) =>
        new() { Polled = new PolledCounter(periodS, jitterFraction) };
}
