namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The forward axis at rest, as the accelerometer stage read it (<see cref="AccelSetup"/>):
/// what it reads standing still (gravity leaking in through the resting pitch, plus the sensor's
/// offset), how well that is known, and how noisy the axis is there. Handed on as it is; a stage
/// that knows the level better makes a new one (<see cref="WithLevel"/>).</summary>
internal sealed record AccelRest
{
    /// <summary>Mean forward reading at rest, m/s².</summary>
    public double LevelMps2 { get; init; }

    /// <summary>σ of <see cref="LevelMps2"/>, m/s².</summary>
    public double LevelSigmaMps2 { get; init; }

    /// <summary>Per-sample noise at rest, m/s².</summary>
    public double NoiseMps2 { get; init; }

    /// <summary>How much the resting noise's correlation from sample to sample widens
    /// uncertainties of averages (1 for white noise).</summary>
    public double CorrelationFactor { get; init; } = 1;

    /// <summary>Mean vertical reading at rest, m/s² (0 without a vertical axis, or when the level
    /// was told rather than read).</summary>
    public double VerticalMps2 { get; init; }

    /// <summary>A level known another way (e.g. the staging event's vector) when the samples
    /// before first motion are too few: its σ taken as the noise told.</summary>
    public static AccelRest Told(double levelMps2, double noiseMps2) => new()
    {
        LevelMps2 = levelMps2,
        LevelSigmaMps2 = noiseMps2,
        NoiseMps2 = noiseMps2,
    };

    /// <summary>This rest with the level replaced by one found another way (e.g. from a stretch
    /// whose acceleration the pulses tell), keeping the noise read with it.</summary>
    public AccelRest WithLevel(double levelMps2, double sigmaMps2) => this with { LevelMps2 = levelMps2, LevelSigmaMps2 = sigmaMps2 };
}
