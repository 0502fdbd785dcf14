namespace LaunchLogger.Decoding.Calibration;

/// <summary>The accelerometer's forward axis calibrated against gravity
/// (<see cref="AccelerometerScaleCalibration"/>).</summary>
public sealed record AccelerometerScaleEstimate
{
    /// <summary>Scale factor: the axis reads this many times the specific force along it.</summary>
    public required Estimate Scale { get; init; }

    /// <summary>Offset: what the axis reads with no force along it, m/s².</summary>
    public required Estimate BiasMps2 { get; init; }

    /// <summary>Local gravity taken, m/s².</summary>
    public required Estimate GravityMps2 { get; init; }

    /// <summary>Largest tilt of the axis from the vertical allowed for, degrees.</summary>
    public required double TiltDeg { get; init; }

    /// <summary>Mean reading of the rest with the axis up, m/s².</summary>
    public required Estimate UpMps2 { get; init; }

    /// <summary>Mean reading of the rest with the axis down, m/s².</summary>
    public required Estimate DownMps2 { get; init; }

    /// <summary>What the user should know.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}
