namespace LaunchLogger.Prescribed.Motion;

/// <summary>Where the car is at one instant of a prescribed trajectory.</summary>
/// <param name="TimeS">Time on the record's axis, s.</param>
/// <param name="DistanceM">Distance along the path from the record's start, m.</param>
/// <param name="SpeedMps">Speed, m/s (never negative).</param>
/// <param name="AccelMps2">Longitudinal acceleration, m/s² (0 while at rest).</param>
public readonly record struct MotionState(double TimeS, double DistanceM, double SpeedMps, double AccelMps2);
