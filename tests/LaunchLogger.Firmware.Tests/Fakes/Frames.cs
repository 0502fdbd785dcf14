using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>One decoded frame: its type, sequence number and the whole unstuffed payload.</summary>
public abstract record Frame(FrameType Type, int Sequence)
{
    /// <summary>The unstuffed payload, CRC included.</summary>
    public byte[] Payload { get; init; } = Array.Empty<byte>();
}

/// <summary>Frame 0x01 (LOG-FORMAT.md, section 3).</summary>
public sealed record ConfigurationFrame(
    int Sequence,
    int FormatVersion,
    int FirmwareMajor,
    int FirmwareMinor,
    int FirmwarePatch,
    long RunNumber,
    long OpenedMicros,
    long OriginCount,
    int Flags,
    long PulsesPerRevolution,
    long CircumferenceMicrometres,
    long? SecondPulsesPerRevolution,
    long? SecondCircumferenceMicrometres,
    long RolloutMicrometres,
    long AccelRateMilliHz,
    long AccelFullScaleMilliG,
    int ForwardAxis,
    int ForwardSign,
    long PreTriggerSamples,
    long StageHoldMicros,
    long StillBandMilliG,
    long MotionThresholdMilliG,
    long MotionConfirmSamples,
    long StopHoldMicros,
    long BracketLimitMicros,
    long StillBlockMicros) : Frame(FrameType.Configuration, Sequence);

/// <summary>One pulse observation as decoded from a pulses frame: count reached in (lo, hi].</summary>
public readonly record struct DecodedObservation(int Channel, long Count, long LoMicros, long HiMicros);

/// <summary>Frame 0x02.</summary>
public sealed record PulsesFrame(int Sequence, int Channel, IReadOnlyList<DecodedObservation> Observations)
    : Frame(FrameType.Pulses, Sequence);

/// <summary>Frame 0x03.</summary>
public sealed record AccelerationFrame(int Sequence, long ReadMicros, long FirstIndex, IReadOnlyList<AccelSample> Samples)
    : Frame(FrameType.Acceleration, Sequence);

/// <summary>Frame 0x04 with its kind-specific fields (null where the kind has none).</summary>
public sealed record EventFrame(int Sequence, EventKind Kind, long TimeMicros) : Frame(FrameType.Event, Sequence)
{
    public long? StagedX { get; init; }

    public long? StagedY { get; init; }

    public long? StagedZ { get; init; }

    public long? StagedSamples { get; init; }

    public MotionCause? Cause { get; init; }

    public long? SpeedMillimetresPerSecond { get; init; }

    public long? LostSamples { get; init; }

    public long? ReadGapMicros { get; init; }
}

/// <summary>Frame 0x05.</summary>
public sealed record HealthFrame(int Sequence, long TimeMicros, IReadOnlyList<long> Counters) : Frame(FrameType.Health, Sequence);

/// <summary>Frame 0x06.</summary>
public sealed record SummaryFrame(
    int Sequence,
    long RunNumber,
    long OpenedMicros,
    long MotionMicros,
    long RolloutMicros,
    long StoppedMicros,
    long Channel0Count,
    long Channel1Count,
    long ObservationsWritten,
    long AccelSamplesWritten,
    long FramesInRun,
    int Flags) : Frame(FrameType.Summary, Sequence);

/// <summary>Frame 0x09: a bench rest opens.</summary>
public sealed record BenchRestFrame(
    int Sequence,
    long RestNumber,
    long OpenedMicros,
    long LengthMicros,
    long AccelRateMilliHz,
    long AccelFullScaleMilliG,
    int ForwardAxis,
    int ForwardSign) : Frame(FrameType.BenchRest, Sequence);

/// <summary>Frame 0x0A: a bench rest ends.</summary>
public sealed record BenchRestEndFrame(
    int Sequence,
    long RestNumber,
    long EndedMicros,
    int Outcome,
    long SamplesWritten,
    long SamplesLost,
    long FramesInRest) : Frame(FrameType.BenchRestEnd, Sequence);

/// <summary>A frame of a type this decoder does not know.</summary>
public sealed record UnknownFrame(FrameType Type, int Sequence) : Frame(Type, Sequence);
