namespace LaunchLogger.Decoding.Reading;

/// <summary>The body of a summary frame (LOG-FORMAT.md, frame 0x06), the last frame of a run.</summary>
public sealed record SummaryBody
{
    /// <summary>Run number since power-up.</summary>
    public long RunNumber { get; init; }

    /// <summary>When the run opened, µs.</summary>
    public long OpenedMicros { get; init; }

    /// <summary>The firmware's first-motion estimate, µs; 0 = none.</summary>
    public long MotionMicros { get; init; }

    /// <summary>The firmware's rollout mark, µs; 0 = not reached.</summary>
    public long RolloutMicros { get; init; }

    /// <summary>When the car stopped (the last pulse's bracket end), µs; 0 = closed otherwise.</summary>
    public long StoppedMicros { get; init; }

    /// <summary>Channel 0's count at the close, from the run's origin.</summary>
    public long Channel0Count { get; init; }

    /// <summary>Channel 1's count at the close (0 without a second channel).</summary>
    public long Channel1Count { get; init; }

    /// <summary>Pulse observations written in the run (both channels).</summary>
    public long ObservationsWritten { get; init; }

    /// <summary>Accelerometer samples written in the run (pre-trigger ring included).</summary>
    public long AccelSamplesWritten { get; init; }

    /// <summary>Frames written in the run, configuration and this summary included.</summary>
    public long FramesWritten { get; init; }

    /// <summary>Flag bit 0: the run opened from standstill after staging.</summary>
    public bool Staged { get; init; }

    /// <summary>Flag bit 1: the rollout distance was reached.</summary>
    public bool RolloutReached { get; init; }

    /// <summary>Flag bit 2: the run closed because the car stopped (clear: shutdown).</summary>
    public bool ClosedByStop { get; init; }
}
