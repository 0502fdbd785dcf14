namespace LaunchLogger.Decoding.Reading;

/// <summary>The body of a configuration frame (LOG-FORMAT.md, frame 0x01) as written: integers
/// with their units in the names. <see cref="Runs.RunAssembler"/> turns it into SI units.</summary>
public sealed record ConfigurationBody
{
    /// <summary>Log format version (1).</summary>
    public int FormatVersion { get; init; }

    /// <summary>Firmware major version.</summary>
    public int FirmwareMajor { get; init; }

    /// <summary>Firmware minor version.</summary>
    public int FirmwareMinor { get; init; }

    /// <summary>Firmware patch version.</summary>
    public int FirmwarePatch { get; init; }

    /// <summary>Run number since power-up (1 for the first).</summary>
    public long RunNumber { get; init; }

    /// <summary>When the run opened, µs of the box's clock.</summary>
    public long OpenedMicros { get; init; }

    /// <summary>The hardware counter's value of channel 0 at the run's origin.</summary>
    public long OriginCount { get; init; }

    /// <summary>Flag bit 0: an accelerometer is fitted.</summary>
    public bool AccelPresent { get; init; }

    /// <summary>Flag bit 1: a second pulse channel is fitted.</summary>
    public bool SecondChannelPresent { get; init; }

    /// <summary>Flag bit 2: the run opened from standstill after staging.</summary>
    public bool Staged { get; init; }

    /// <summary>Channel 0 pulses per revolution.</summary>
    public int PulsesPerRevolution { get; init; }

    /// <summary>Channel 0 rolling circumference, µm.</summary>
    public long CircumferenceMicrometres { get; init; }

    /// <summary>Channel 1 pulses per revolution (0 without a second channel).</summary>
    public int SecondPulsesPerRevolution { get; init; }

    /// <summary>Channel 1 rolling circumference, µm (0 without a second channel).</summary>
    public long SecondCircumferenceMicrometres { get; init; }

    /// <summary>Rollout distance, µm.</summary>
    public long RolloutMicrometres { get; init; }

    /// <summary>Nominal accelerometer output data rate, mHz (0 without one).</summary>
    public long AccelOutputDataRateMilliHz { get; init; }

    /// <summary>Accelerometer full scale, milli-g.</summary>
    public long AccelFullScaleMilliG { get; init; }

    /// <summary>Sensor axis pointing along the car: 0 = x, 1 = y, 2 = z.</summary>
    public int ForwardAxis { get; init; }

    /// <summary>True when <see cref="ForwardAxis"/> points backward.</summary>
    public bool ForwardAxisReversed { get; init; }

    /// <summary>Pre-trigger ring length, samples.</summary>
    public long PreTriggerSamples { get; init; }

    /// <summary>Stillness needed for staging, µs.</summary>
    public long StageHoldMicros { get; init; }

    /// <summary>Still band, milli-g peak to peak per axis (of the means of blocks of <see cref="StillBlockMicros"/>).</summary>
    public long StillBandMilliG { get; init; }

    /// <summary>Motion threshold, milli-g.</summary>
    public long MotionThresholdMilliG { get; init; }

    /// <summary>Motion confirm window, samples.</summary>
    public long MotionConfirmSamples { get; init; }

    /// <summary>Time without pulses that ends a run, µs.</summary>
    public long StopHoldMicros { get; init; }

    /// <summary>Bracket width above which an observation counts as wide, µs.</summary>
    public long BracketLimitMicros { get; init; }

    /// <summary>Length of the blocks whose means the still band bounds, µs; 0 when the box did not
    /// record it (logs from before the field: 50 ms blocks, or single samples before 2026-12-04).</summary>
    public long StillBlockMicros { get; init; }
}
