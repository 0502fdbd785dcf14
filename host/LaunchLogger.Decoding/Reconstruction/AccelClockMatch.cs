namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The accelerometer moved onto the pulses' clock, as the clock stage matched it
/// (<see cref="AccelClockAlignment"/>).</summary>
internal sealed class AccelClockMatch
{
    /// <summary>The samples on the pulses' clock: a new axis, the one read stays as it was.</summary>
    public required ForwardAcceleration Accel { get; init; }

    /// <summary>The onset of motion on the pulses' clock.</summary>
    public required AccelOnset Onset { get; init; }

    /// <summary>How far the samples were moved, s: minus the offset δ (accelerometer time − pulse
    /// time) the match and its prior give.</summary>
    public double ShiftS { get; init; }

    /// <summary>σ of the offset, s: from now on, how far the accelerometer's axis may still stand
    /// from the pulses'.</summary>
    public double OffsetSigmaS { get; init; }

    /// <summary>The report's note on the move.</summary>
    public required string Note { get; init; }
}
