namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The pulse channel that carries distance, as the channel stage chose and checked it.</summary>
internal sealed class DistanceChannel
{
    /// <summary>The chosen channel, or null without pulses (or when pulses are not used).</summary>
    public PulseChannel? Pulses { get; init; }

    /// <summary>Distance per pulse of <see cref="Pulses"/>, m: the configuration's times the
    /// rolling-over-told ratio of the options (the first channel's when there are no pulses).</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>Which channel was chosen: 0 for the first, 1 for the second.</summary>
    public int Index { get; init; }

    /// <summary>Why the second channel was taken over the first (the first turned more under
    /// drive), or null.</summary>
    public string? ChoiceNote { get; init; }

    /// <summary>Each observation's tooth offset from the ring's measured positions, m, or null
    /// when they were not measured.</summary>
    public double[]? ToothOffsets { get; init; }

    /// <summary>Distance noise of one pulse observation at the record's start, m (for
    /// <see cref="StartMotion"/>); 0 without pulses.</summary>
    public double StartNoiseM { get; init; }

    /// <summary>The notes of the tooth-position measurement and of the bracket check, in that order.</summary>
    public required List<string> Warnings { get; init; }
}
