namespace LaunchLogger.Cli.Verbs;

/// <summary>What <c>launchlogger calibrate accelerometer</c> was asked, typed.</summary>
public sealed record CalibrateAccelerometerRequest
{
    /// <summary>The rest with the forward axis pointing up, then the one with it pointing down:
    /// logs holding the box's bench rests, or accelerometer CSV files
    /// (<c>t_s,ax_mps2[,ay_mps2,az_mps2]</c>); or one log holding both rests, up first.</summary>
    public required IReadOnlyList<FileInfo> Rests { get; init; }

    /// <summary>Run numbers (from 1, in log order), one per log, when a log holds several.</summary>
    public IReadOnlyList<string> Runs { get; init; } = [];

    /// <summary>Bench rest numbers (from 1, in log order), one per log when a log holds several;
    /// two when one log holds both rests.</summary>
    public IReadOnlyList<string> BenchRests { get; init; } = [];

    /// <summary>Latitude of the place, degrees north; null for standard gravity with the globe's spread.</summary>
    public double? LatitudeDeg { get; init; }

    /// <summary>Height above sea level, m.</summary>
    public double ElevationM { get; init; }

    /// <summary>Largest tilt of the axis from the vertical in either rest, degrees.</summary>
    public double TiltDeg { get; init; } = Decoding.Calibration.AccelerometerScaleCalibration.DefaultTiltDeg;

    /// <summary>Settings file to create or update.</summary>
    public FileInfo? Settings { get; init; }

    /// <summary>True for JSON output.</summary>
    public bool Json { get; init; }
}
