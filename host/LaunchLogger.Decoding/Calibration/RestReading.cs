namespace LaunchLogger.Decoding.Calibration;

/// <summary>What the accelerometer read while the car stood still before a run: the mean
/// specific force on the car's axes (as the log's axis mapping gives them) and the pitch and
/// roll that follow from it.</summary>
/// <param name="Source">The run.</param>
/// <param name="StartS">First sample of the still window, seconds on the run's axis.</param>
/// <param name="EndS">Last sample of the still window, seconds.</param>
/// <param name="Samples">Samples averaged.</param>
/// <param name="ForwardMps2">Mean forward specific force with its 1 σ, m/s².</param>
/// <param name="LateralMps2">Mean lateral (left) specific force with its 1 σ, m/s².</param>
/// <param name="VerticalMps2">Mean vertical specific force with its 1 σ, m/s².</param>
/// <param name="PitchRad">asin(forward / |mean vector|): the resting pitch, nose up positive,
/// with the forward axis' offset in it as an equivalent angle; 1 σ from the forward mean's.</param>
/// <param name="RollRad">Resting roll, left side up positive: atan2(lateral, vertical), so a lateral axis whose left end is raised reads positive.</param>
public sealed record RestReading(
    string Source,
    double StartS,
    double EndS,
    int Samples,
    Estimate ForwardMps2,
    Estimate LateralMps2,
    Estimate VerticalMps2,
    Estimate PitchRad,
    Estimate RollRad)
{
    /// <summary>Length of the still window, seconds.</summary>
    public double DurationS => EndS - StartS;
}
