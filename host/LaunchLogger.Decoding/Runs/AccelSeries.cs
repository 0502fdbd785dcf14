namespace LaunchLogger.Decoding.Runs;

/// <summary>Accelerometer samples of one run with times on the input's axis, in SI units and in
/// the car's frame as far as the configuration tells it (x forward).</summary>
/// <remarks>Specific force (what an accelerometer measures: acceleration minus gravity), m/s².
/// At rest on level ground the vertical reads +g0. Arrays are the same length, times ascending.
/// A log's series holds its samples packed as the box wrote them and builds each array the first
/// time it is read (the same values every time), so the reader does not make arrays nobody reads.</remarks>
public sealed class AccelSeries
{
    private readonly PackedAccelSamples? packed;
    private double[]? time;
    private double[]? forward;
    private double[]? lateral;
    private double[]? vertical;
    private long[]? index;

    /// <summary>A series whose arrays are given (plain-text inputs, cuts of a series).</summary>
    public AccelSeries()
    {
    }

    /// <summary>A log's series, kept packed until an array is asked for.</summary>
    internal AccelSeries(PackedAccelSamples packed)
    {
        this.packed = packed;
    }

    /// <summary>Sample times, seconds.</summary>
    public double[] TimeS
    {
        get => time ?? Expand(ref time, static p => p.Times());
        init => time = value;
    }

    /// <summary>Specific force along the car's forward axis, forward positive, m/s².</summary>
    public double[] ForwardMps2
    {
        get => forward ?? Expand(ref forward, static p => p.Forward());
        init => forward = value;
    }

    /// <summary>Specific force along the lateral axis, m/s² (zeros when not measured).</summary>
    public double[] LateralMps2
    {
        get => lateral ?? Expand(ref lateral, static p => p.Lateral());
        init => lateral = value;
    }

    /// <summary>Specific force along the vertical axis, m/s² (zeros when not measured).</summary>
    public double[] VerticalMps2
    {
        get => vertical ?? Expand(ref vertical, static p => p.Vertical());
        init => vertical = value;
    }

    /// <summary>True when lateral and vertical axes were measured.</summary>
    public bool HasAllAxes { get; init; }

    /// <summary>The sample period the times were built with, seconds (estimated for logs).</summary>
    public double SamplePeriodS { get; init; }

    /// <summary>1-σ uncertainty of <see cref="SamplePeriodS"/>, seconds (0 when given).</summary>
    public double SamplePeriodUncertaintyS { get; init; }

    /// <summary>The sensor's index of each sample (logs only; null for plain-text inputs).</summary>
    public long[]? SampleIndex
    {
        get => index ?? (packed == null ? null : Expand(ref index, static p => p.Indices()));
        init => index = value;
    }

    /// <summary>For plain-text inputs cut from a longer record: the time of the record's first
    /// sample, where the sensor's own clock was last tied to the input's axis (null: this series'
    /// own first sample).</summary>
    public double? ClockOriginS { get; init; }

    /// <summary>Which sensor axes became forward, lateral and vertical (logs only).</summary>
    public AxisMapping? Axes { get; init; }

    /// <summary>Number of samples.</summary>
    public int Count => packed?.Count ?? TimeS.Length;

    /// <summary>Builds an array from the packed samples the first time it is asked for; every
    /// caller gets the same array, even when two threads ask at once.</summary>
    /// <exception cref="InvalidOperationException">The series was made without that array.</exception>
    private T[] Expand<T>(ref T[]? slot, Func<PackedAccelSamples, T[]> build)
    {
        if (packed == null)
        {
            throw new InvalidOperationException("this accelerometer series was made without its arrays");
        }

        return Interlocked.CompareExchange(ref slot, build(packed), null) ?? slot!;
    }
}
