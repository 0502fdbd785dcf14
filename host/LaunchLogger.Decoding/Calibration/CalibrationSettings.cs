namespace LaunchLogger.Decoding.Calibration;

/// <summary>What calibration found out about one car and box, saved in a small JSON settings
/// file (see <see cref="CalibrationFile"/>) that <c>launchlogger report --settings</c> applies.
/// Every value is optional: what is absent is taken from the log.</summary>
public sealed record CalibrationSettings
{
    /// <summary>Settings format version.</summary>
    public int Version { get; init; } = 1;

    /// <summary>Free text: which car, which tyres and pressures, where and when.</summary>
    public string? Notes { get; init; }

    /// <summary>Measured rolling circumference of the distance channel's wheel, m; replaces the
    /// log's configured value.</summary>
    public double? CircumferenceM { get; init; }

    /// <summary>1-σ of <see cref="CircumferenceM"/>, m.</summary>
    public double? CircumferenceSigmaM { get; init; }

    /// <summary>Pitch of the box on the car (nose-up positive), degrees, including the forward
    /// axis' bias as an equivalent angle: the resting pitch on level ground. Subtracted from the
    /// resting pitch at staging to give the road's grade.</summary>
    public double? MountingPitchDeg { get; init; }

    /// <summary>1-σ of <see cref="MountingPitchDeg"/>, degrees.</summary>
    public double? MountingPitchSigmaDeg { get; init; }

    /// <summary>Yaw of the box's forward axis from the car's centre line, degrees (positive to
    /// the left).</summary>
    public double? MountingYawDeg { get; init; }

    /// <summary>Relative length of each tooth gap of the distance channel, in pulse order from
    /// a reference tooth (mean 1.0); null when not mapped.</summary>
    public IReadOnlyList<double>? ToothSpacing { get; init; }
}
