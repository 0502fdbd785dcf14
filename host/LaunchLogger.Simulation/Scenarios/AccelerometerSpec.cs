namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The three-axis accelerometer: its sampling, errors and mounting in the car.</summary>
/// <remarks>The sensor's x axis nominally points forward, y left and z up. Mounting angles turn it
/// away from that: pitch raises the x axis' front, roll raises the y axis' left end, yaw turns x
/// towards the left. Readings are specific force (acceleration minus gravity) in milli-g,
/// quantised to whole milli-g and clipped at full scale like a real sensor's int16 output.</remarks>
public sealed record AccelerometerSpec
{
    /// <summary>True when the box has an accelerometer.</summary>
    public bool Present { get; init; } = true;

    /// <summary>Nominal output data rate, Hz.</summary>
    public double OutputDataRateHz { get; init; } = 800;

    /// <summary>How fast the sensor's own clock runs against the box's, ppm (positive: samples
    /// come faster than nominal).</summary>
    public double ClockDriftPpm { get; init; } = 1500;

    /// <summary>Samples the sensor's FIFO holds; older ones are lost when it overflows.</summary>
    public int FifoDepth { get; init; } = 32;

    /// <summary>How often the box reads the FIFO, µs.</summary>
    public int ReadIntervalMicros { get; init; } = 10_000;

    /// <summary>Noise density, µg/√Hz; the per-sample noise is this × √(ODR/2).</summary>
    public double NoiseDensityMicroGPerRootHz { get; init; } = 150;

    /// <summary>Vibration of the running car at the mount, milli-g rms on each axis (white).</summary>
    public double VibrationMilliGRms { get; init; } = 3;

    /// <summary>Zero-g offset per axis, milli-g.</summary>
    public AxisTriple BiasMilliG { get; init; } = new(12, -8, 20);

    /// <summary>Scale factor error per axis, as a fraction (0.01 = reads 1 % high).</summary>
    public AxisTriple ScaleError { get; init; } = new(0.005, -0.004, 0.008);

    /// <summary>Mounting pitch: the x axis' front raised above the car's floor plane, degrees.</summary>
    public double MountPitchDeg { get; init; } = 1.5;

    /// <summary>Mounting roll: the y axis' left end raised, degrees.</summary>
    public double MountRollDeg { get; init; } = -0.8;

    /// <summary>Mounting yaw: the x axis turned to the left of straight ahead, degrees.</summary>
    public double MountYawDeg { get; init; } = 2.0;

    /// <summary>Full scale, g; readings clip at ± this.</summary>
    public double FullScaleG { get; init; } = 8;
}
