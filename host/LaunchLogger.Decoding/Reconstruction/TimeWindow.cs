namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>A stretch of time on the input's axis.</summary>
/// <param name="StartS">Start, seconds.</param>
/// <param name="EndS">End, seconds (≥ <paramref name="StartS"/>).</param>
public readonly record struct TimeWindow(double StartS, double EndS)
{
    /// <summary>Length, seconds.</summary>
    public double LengthS => EndS - StartS;

    /// <summary>True when <paramref name="timeS"/> lies inside the window (ends included).</summary>
    public bool Contains(double timeS) => timeS >= StartS && timeS <= EndS;
}
