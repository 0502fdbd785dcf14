namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the accelerometer stage reads: the samples, the distance channel, how the record
/// opens, the box's marks and its resting gravity vector.</summary>
internal sealed record AccelSetupInputs
{
    /// <summary>The forward axis' samples, read only: the resting level found in them is the
    /// stage's product (<see cref="PreparedAccel.Rest"/>).</summary>
    public required ForwardAcceleration Accel { get; init; }

    /// <summary>The distance channel, or null without pulses.</summary>
    public PulseChannel? Pulses { get; init; }

    /// <summary>Distance per pulse of <see cref="Pulses"/>, m.</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>The box's own mark of first motion (its estimate, or its motion event), s, or null.</summary>
    public double? MotionHintS { get; init; }

    /// <summary>True when a rest was seen before the motion.</summary>
    public bool Staged { get; init; }

    /// <summary>How the first pulses open the record, or null without enough of them.</summary>
    public StartMotion? Opening { get; init; }

    /// <summary>True when the box marked the car stopped.</summary>
    public bool StoppedEvent { get; init; }

    /// <summary>The box's resting gravity vector at staging, milli-g on the sensor's axes, or null.</summary>
    public (double X, double Y, double Z)? RestGravityMilliG { get; init; }

    /// <summary>The sensor axis along the car (0 = x, 1 = y, 2 = z).</summary>
    public int ForwardAxis { get; init; }

    /// <summary>True when that axis points backwards.</summary>
    public bool ForwardAxisReversed { get; init; }

    /// <summary>Thresholds, the scale calibration and whether to compensate the body's pitch.</summary>
    public required ReconstructionOptions Options { get; init; }
}
