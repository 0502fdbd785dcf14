namespace LaunchLogger.Decoding.Runs;

/// <summary>Accelerometer samples of one run with times on the input's axis, in SI units and in
/// the car's frame as far as the configuration tells it (x forward).</summary>
/// <remarks>Specific force (what an accelerometer measures: acceleration minus gravity), m/s².
/// At rest on level ground the vertical reads +g0. Arrays are the same length, times ascending.</remarks>
public sealed class AccelSeries
{
    /// <summary>Sample times, seconds.</summary>
    public required double[] TimeS { get; init; }

    /// <summary>Specific force along the car's forward axis, forward positive, m/s².</summary>
    public required double[] ForwardMps2 { get; init; }

    /// <summary>Specific force along the lateral axis, m/s² (zeros when not measured).</summary>
    public required double[] LateralMps2 { get; init; }

    /// <summary>Specific force along the vertical axis, m/s² (zeros when not measured).</summary>
    public required double[] VerticalMps2 { get; init; }

    /// <summary>True when lateral and vertical axes were measured.</summary>
    public bool HasAllAxes { get; init; }

    /// <summary>The sample period the times were built with, seconds (estimated for logs).</summary>
    public double SamplePeriodS { get; init; }

    /// <summary>1-σ uncertainty of <see cref="SamplePeriodS"/>, seconds (0 when given).</summary>
    public double SamplePeriodUncertaintyS { get; init; }

    /// <summary>The sensor's index of each sample (logs only; null for plain-text inputs).</summary>
    public long[]? SampleIndex { get; init; }

    /// <summary>For plain-text inputs cut from a longer record: the time of the record's first
    /// sample, where the sensor's own clock was last tied to the input's axis (null: this series'
    /// own first sample).</summary>
    public double? ClockOriginS { get; init; }

    /// <summary>Which sensor axes became forward, lateral and vertical (logs only).</summary>
    public AxisMapping? Axes { get; init; }

    /// <summary>Number of samples.</summary>
    public int Count => TimeS.Length;
}
