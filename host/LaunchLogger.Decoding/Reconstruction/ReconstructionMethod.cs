namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Names of the ways a run can be reconstructed, as <see cref="ReconstructedRun.Method"/>
/// reports them.</summary>
public static class ReconstructionMethod
{
    /// <summary>Pulse counts and accelerometer fused.</summary>
    public const string PulsesAndAccelerometer = "pulses and accelerometer";

    /// <summary>Pulse counts with a kinematic model; no accelerometer.</summary>
    public const string PulsesOnly = "pulses only";

    /// <summary>Integrated acceleration; no pulses.</summary>
    public const string AccelerometerOnly = "accelerometer only";

    /// <summary>The reference we measure ourselves against: first pulse as the start, speed from
    /// pulses counted over a sliding 0.1 s window, linear interpolation.</summary>
    public const string NaiveFirstEdge = "naive: first edge as start";
}
