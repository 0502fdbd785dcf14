namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The box's capture path and main loop timing.</summary>
public sealed record CaptureSpec
{
    /// <summary>Exact edge timestamps or a polled counter.</summary>
    public CaptureKind Kind { get; init; } = CaptureKind.PolledCounter;

    /// <summary>Mean period of the main loop, µs (the poll period for a polled counter).</summary>
    public double LoopPeriodMicros { get; init; } = 250;

    /// <summary>1-σ jitter of each loop period, µs.</summary>
    public double LoopJitterMicros { get; init; } = 40;

    /// <summary>Mean number of long loop pauses per second (garbage collection, flash writes).</summary>
    public double PausesPerSecond { get; init; }

    /// <summary>Length of one long pause, µs.</summary>
    public double PauseMicros { get; init; } = 5000;

    /// <summary>Mean delay from an edge to its timestamp, µs (exact edges only).</summary>
    public double EdgeLatencyMicros { get; init; } = 15;

    /// <summary>1-σ spread of that delay, µs; the delay is never negative (exact edges only).</summary>
    public double EdgeJitterMicros { get; init; } = 5;

    /// <summary>Capacity of the queue between the edge timestamper and the loop (exact edges only).</summary>
    public int QueueCapacity { get; init; } = 1024;
}
