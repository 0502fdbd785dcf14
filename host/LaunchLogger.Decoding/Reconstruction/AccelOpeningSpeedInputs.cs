namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the opening-speed stage reads (<see cref="AccelOpeningSpeed"/>): an
/// accelerometer-only record as the accelerometer stage prepared it, and where it comes to rest.</summary>
internal sealed record AccelOpeningSpeedInputs
{
    /// <summary>The forward axis' samples; read only.</summary>
    public required ForwardAcceleration Accel { get; init; }

    /// <summary>The forward axis' resting level (<see cref="PreparedAccel.Rest"/>): its noise sets
    /// the σ of the level read at the final rest.</summary>
    public required AccelRest Rest { get; init; }

    /// <summary>The forward input at each sample, m/s² (<see cref="PreparedAccel.InputMps2"/>).</summary>
    public required double[] InputMps2 { get; init; }

    /// <summary>Where the record comes to rest over its whole span, s, or null when it does not.</summary>
    public double? StopS { get; init; }

    /// <summary>The accelerometer's wander and scale σ.</summary>
    public required ReconstructionOptions Options { get; init; }
}
