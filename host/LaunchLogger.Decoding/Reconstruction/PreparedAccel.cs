namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The accelerometer as the accelerometer stage prepared it.</summary>
internal sealed class PreparedAccel
{
    /// <summary>The forward axis' resting level, its σ and the noise read with it: what
    /// <see cref="InputMps2"/> has removed, and what every later reader of the level takes.</summary>
    public required AccelRest Rest { get; init; }

    /// <summary>The onset of motion the samples show, or null (a record that opens moving, or none clear).</summary>
    public AccelOnset? Onset { get; init; }

    /// <summary>The resting pitch, rad: the angle whose sine is the resting level over gravity.</summary>
    public double PitchRad { get; init; }

    /// <summary>σ of <see cref="PitchRad"/>, rad.</summary>
    public double PitchSigmaRad { get; init; }

    /// <summary>The forward input at each sample, m/s²: the resting level removed, the body's
    /// pitch taken out when told, the calibrated scale divided out.</summary>
    public required double[] InputMps2 { get; init; }

    /// <summary>Where the samples the level was also read from at the record's final rest begin,
    /// s; +∞ when the level was not read there.</summary>
    public double FinalRestFromS { get; init; } = double.PositiveInfinity;

    /// <summary>Notes on where the resting level came from.</summary>
    public required List<string> Warnings { get; init; }
}
