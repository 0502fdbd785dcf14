namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the rolling-scale stage reads: the step grid, the pulses, the windows the wheel
/// does not roll freely in, the filter's first pass and the accelerometer's calibration.</summary>
internal sealed record RollingScaleInputs
{
    /// <summary>The time grid with the accelerometer input integrated over each step.</summary>
    public required StepGrid Steps { get; init; }

    /// <summary>First motion (or the record's first observation when it opens moving), s.</summary>
    public double StartS { get; init; }

    /// <summary>The stop, s, or null when the run does not end at rest.</summary>
    public double? StopS { get; init; }

    /// <summary>Stretches where the pulses are not used for distance (wheelspin).</summary>
    public required List<TimeWindow> Spin { get; init; }

    /// <summary>Stretches of braking where the wheel slid.</summary>
    public required List<TimeWindow> Slides { get; init; }

    /// <summary>The distance channel, or null without pulses.</summary>
    public PulseChannel? Pulses { get; init; }

    /// <summary>Distance per pulse of <see cref="Pulses"/>, m, as told (and the tyre's ratio applied).</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>True when a rest was seen before the motion.</summary>
    public bool Staged { get; init; }

    /// <summary>How the first pulses open the record, or null without enough of them.</summary>
    public StartMotion? Opening { get; init; }

    /// <summary>The last accelerometer sample's time, s, or null without an accelerometer.</summary>
    public double? AccelEndS { get; init; }

    /// <summary>σ of the accelerometer's resting level, m/s².</summary>
    public double AccelRestLevelSigmaMps2 { get; init; }

    /// <summary>Noise density of the accelerometer's input from <see cref="StartS"/> on, m²/s³.</summary>
    public double InputDensity { get; init; }

    /// <summary>Where the samples the level was also read from at the final rest begin, s (+∞ for none).</summary>
    public double FinalRestFromS { get; init; } = double.PositiveInfinity;

    /// <summary>True when the filter's first pass kept a drive-slip coefficient.</summary>
    public bool SlipKept { get; init; }

    /// <summary>True when the first pass's slip coefficient lies beyond 3σ of an undriven wheel's.</summary>
    public bool SlipToldApart { get; init; }

    /// <summary>The filter's first pass's speed on the grid, m/s.</summary>
    public required double[] FirstPassSpeedMps { get; init; }

    /// <summary>The calibration (the accelerometer's scale), priors and the fit's windows.</summary>
    public required ReconstructionOptions Options { get; init; }
}
