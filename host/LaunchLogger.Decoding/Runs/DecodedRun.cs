namespace LaunchLogger.Decoding.Runs;

/// <summary>One run as the input holds it, before any reconstruction: pulse observations,
/// accelerometer samples, events and what went wrong while capturing or reading.</summary>
/// <remarks>Made by the log reader's run assembler or by the plain-text importers; consumed by
/// reconstruction. Times are seconds on the input's own axis (the box's clock for logs).</remarks>
public sealed record DecodedRun
{
    /// <summary>Where the run came from (file name, and run number for logs).</summary>
    public required string Source { get; init; }

    /// <summary>The run's configuration.</summary>
    public required RunConfiguration Configuration { get; init; }

    /// <summary>Observations of the distance channel, in time order, counts from the origin.</summary>
    public required IReadOnlyList<PulseRecord> Pulses { get; init; }

    /// <summary>Observations of the second channel (empty without one).</summary>
    public IReadOnlyList<PulseRecord> SecondPulses { get; init; } = [];

    /// <summary>Accelerometer samples, or null when the input has none.</summary>
    public AccelSeries? Accel { get; init; }

    /// <summary>Events in time order.</summary>
    public IReadOnlyList<RunEvent> Events { get; init; } = [];

    /// <summary>The box's resting gravity vector at staging (milli-g, sensor axes), when recorded.</summary>
    public (double X, double Y, double Z)? RestGravityMilliG { get; init; }

    /// <summary>The box's own first-motion estimate, seconds, when the log has one.</summary>
    public double? FirmwareMotionS { get; init; }

    /// <summary>The box's own rollout mark, seconds, when the log has one.</summary>
    public double? FirmwareRolloutS { get; init; }

    /// <summary>Health counters at the run's close, differenced against the run's opening where
    /// possible, by name (e.g. "clock_wraps", "pulse_observations_dropped").</summary>
    public IReadOnlyDictionary<string, long> Health { get; init; } = new Dictionary<string, long>();

    /// <summary>Frames missing inside this run by their sequence numbers (lost or damaged).</summary>
    public long FramesLost { get; init; }

    /// <summary>True when the run's summary frame was read (the run closed normally).</summary>
    public bool Complete { get; init; }

    /// <summary>What the reader or importer noticed: lost frames, CRC errors, cut-off logs.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}
