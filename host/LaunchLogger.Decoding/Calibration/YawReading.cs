namespace LaunchLogger.Decoding.Calibration;

/// <summary>The box's yaw on the car's floor from one straight acceleration: the direction of the
/// horizontal specific force, which then points along the car.</summary>
/// <param name="Source">The run.</param>
/// <param name="YawRad">Yaw of the box's forward axis from the car's centre line, radians,
/// positive to the left, with its 1 σ.</param>
/// <param name="Samples">Samples of firm acceleration used.</param>
/// <param name="DurationS">Time they cover, seconds.</param>
/// <param name="MeanForwardMps2">Their mean forward specific force above the resting level, m/s².</param>
public sealed record YawReading(string Source, Estimate YawRad, int Samples, double DurationS, double MeanForwardMps2);
