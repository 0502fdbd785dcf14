namespace LaunchLogger.Prescribed.Sensors;

/// <summary>One accelerometer sample: specific force in the sensor's axes (x forward, y left,
/// z up as mounted), m/s².</summary>
/// <param name="StampS">The time the box gives it (nominal rate from the first sample).</param>
/// <param name="TrueS">When it was really taken (the sensor's own clock drifts).</param>
/// <param name="XMps2">Forward axis.</param>
/// <param name="YMps2">Lateral axis.</param>
/// <param name="ZMps2">Vertical axis.</param>
public readonly record struct AccelSample(double StampS, double TrueS, double XMps2, double YMps2, double ZMps2);
