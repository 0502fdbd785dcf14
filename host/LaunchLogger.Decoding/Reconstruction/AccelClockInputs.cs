namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the clock stage reads (<see cref="AccelClockAlignment"/>): the accelerometer as the
/// accelerometer stage prepared it, the pulses it is matched to, the onset on the accelerometer's
/// own axis, and how far that axis may have slid by then.</summary>
internal sealed record AccelClockInputs
{
    /// <summary>The forward axis' samples on the accelerometer's own clock; read only.</summary>
    public required ForwardAcceleration Accel { get; init; }

    /// <summary>The forward axis' resting level (<see cref="PreparedAccel.Rest"/>).</summary>
    public required AccelRest Rest { get; init; }

    /// <summary>The forward input at each sample, m/s² (<see cref="PreparedAccel.InputMps2"/>).</summary>
    public required double[] InputMps2 { get; init; }

    /// <summary>The resting pitch, rad (<see cref="PreparedAccel.PitchRad"/>).</summary>
    public double PitchRad { get; init; }

    /// <summary>The onset of motion on the accelerometer's axis.</summary>
    public required AccelOnset Onset { get; init; }

    /// <summary>The distance channel.</summary>
    public required PulseChannel Pulses { get; init; }

    /// <summary>Distance per pulse of <see cref="Pulses"/>, m.</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>How far the accelerometer's axis may have slid against the pulses' by the onset, s
    /// (1σ; the prior the match is combined with): the clock rate's error times the time since the
    /// first sample for a plain-text file, 0 for a log.</summary>
    public double PriorOffsetSigmaS { get; init; }

    /// <summary>The tooth spacing's spread, the clock rate's σ, an undriven wheel's slip, the
    /// input's noise allowance, whether the body's pitch is compensated and the scale calibration.</summary>
    public required ReconstructionOptions Options { get; init; }
}
