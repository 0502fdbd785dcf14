using LaunchLogger.Prescribed.Output;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Prescribed;

/// <summary>Everything that makes one generated record: the shape, the pickup and tyre, how the
/// pulses are captured, the accelerometer and the seed. A record with defaults for every part
/// but the shape, so a test says only what it varies (<c>spec with { … }</c>).</summary>
public sealed record PrescribedRecordSpec
{
    /// <summary>The trajectory and its name.</summary>
    public required Shape Shape { get; init; }

    /// <summary>The pickup: 48 teeth on a calibrated 1.96 m tyre by default.</summary>
    public WheelPickup Pickup { get; init; } = new(48, TyreModel.Calibrated(1.96));

    /// <summary>Edge timestamps (1 µs, no jitter by default); ignored when
    /// <see cref="Polled"/> is set.</summary>
    public EdgeTiming Edges { get; init; } = new();

    /// <summary>A polled counter instead of edge timestamps, or null.</summary>
    public PolledCounter? Polled { get; init; }

    /// <summary>The accelerometer, or null for pulses only. Default: 400 Hz, 150 µg/√Hz.</summary>
    public AccelSensor? Accel { get; init; } = new() { NoiseMicroGPerRootHz = 150 };

    /// <summary>The brake switch's delay after onset (logs only), or null for none.</summary>
    public double? BrakeSwitchDelayS { get; init; }

    /// <summary>Seed for every random part.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>Generates the record.</summary>
    public PrescribedRecord Generate() => PrescribedRecord.Generate(this);

    /// <summary>Options for writing this record as a log.</summary>
    public LogOptions LogOptions => new()
    {
        Capture = Polled is { } p ? new LogCapture { Polled = p } : new LogCapture { Edges = Edges },
        AccelRateHz = Accel?.RateHz ?? 400,
        BrakeSwitchDelayS = BrakeSwitchDelayS,
    };

    /// <inheritdoc/>
    public override string ToString() =>
        $"{Shape.Name}; {Pickup.Teeth} teeth; {(Polled is { } p ? FormattableString.Invariant($"polled every {p.PeriodS * 1e3:0.##} ms") : "edges")}; {(Accel is { } a ? FormattableString.Invariant($"accelerometer {a.RateHz:0} Hz") : "no accelerometer")}; seed {Seed}";
}
