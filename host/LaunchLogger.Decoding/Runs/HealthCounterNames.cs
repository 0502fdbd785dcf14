namespace LaunchLogger.Decoding.Runs;

/// <summary>The names <see cref="DecodedRun.Health"/> uses for the health frame's counters, in
/// log order (LOG-FORMAT.md, frame 0x05).</summary>
public static class HealthCounterNames
{
    /// <summary>Times the 32-bit µs counter rolled over.</summary>
    public const string ClockWraps = "clock_wraps";

    /// <summary>Pulse observations dropped because the capture queue was full.</summary>
    public const string PulseObservationsDropped = "pulse_observations_dropped";

    /// <summary>Accelerometer reads that failed.</summary>
    public const string AccelReadFailures = "accel_read_failures";

    /// <summary>Accelerometer FIFO overflows.</summary>
    public const string AccelFifoOverflows = "accel_fifo_overflows";

    /// <summary>Observations whose bracket was wider than the configured limit.</summary>
    public const string WideBrackets = "wide_brackets";

    /// <summary>The widest bracket seen since power-up, µs: a maximum, so never differenced.</summary>
    public const string WidestBracketMicros = "widest_bracket_micros";

    /// <summary>Observations discarded because the count went backwards.</summary>
    public const string CountsWentBackwards = "counts_went_backwards";

    /// <summary>Frames the box's byte sink refused.</summary>
    public const string FramesRefused = "frames_refused";

    /// <summary>Accelerometer samples at full scale on any axis.</summary>
    public const string AccelSamplesClipped = "accel_samples_clipped";

    /// <summary>Index of <see cref="WidestBracketMicros"/> in the health frame.</summary>
    public const int WidestBracketIndex = 5;

    /// <summary>All names, indexed as the health frame orders its counters.</summary>
    public static IReadOnlyList<string> InLogOrder { get; } =
    [
        ClockWraps, PulseObservationsDropped, AccelReadFailures, AccelFifoOverflows, WideBrackets,
        WidestBracketMicros, CountsWentBackwards, FramesRefused, AccelSamplesClipped,
    ];
}
