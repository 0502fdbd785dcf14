namespace LaunchLogger.Decoding.Calibration;

/// <summary>A run cannot give the calibration asked of it (too short, not from a standstill,
/// brackets too wide…); the message says which run and why, in one line.</summary>
public sealed class CalibrationException : Exception
{
    /// <summary>Creates the exception.</summary>
    public CalibrationException(string message, Exception? inner = null)
        : base(message, inner)
    {
    }
}
