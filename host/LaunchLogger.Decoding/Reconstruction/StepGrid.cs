namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The time grid with the accelerometer input integrated over each step.</summary>
internal sealed class StepGrid
{
    /// <summary>Grid points, seconds, ascending.</summary>
    public required double[] TimeS { get; init; }

    /// <summary>Speed the input adds over the step from each point to the next, m/s (0 at the last point).</summary>
    public required double[] StepSpeedMps { get; init; }

    /// <summary>Distance the input adds over each step at zero speed at its start, m.</summary>
    public required double[] StepDistanceM { get; init; }

    /// <summary>True for a step the input does not cover (a gap in the samples, or after them).</summary>
    public required bool[] NoInput { get; init; }

    /// <summary>Speed the input adds from first motion to the first grid point after it, m/s.</summary>
    public double StartSpeedMps { get; init; }

    /// <summary>Distance the input adds from first motion to the first grid point after it, m.</summary>
    public double StartDistanceM { get; init; }
}
