namespace LaunchLogger.Decoding.Calibration;

/// <summary>The relative length of each tooth gap of the distance channel's ring, measured
/// from a steady cruise.</summary>
public sealed record ToothSpacingMap
{
    /// <summary>The run it came from.</summary>
    public required string Source { get; init; }

    /// <summary>Pulses per revolution: the number of gaps.</summary>
    public required int PulsesPerRevolution { get; init; }

    /// <summary>Relative length of gap k (mean exactly 1): the gap that ends at the edge where
    /// the hardware counter reaches a value ≡ k modulo <see cref="PulsesPerRevolution"/>
    /// (see <see cref="IndexedByHardwareCount"/>).</summary>
    public required IReadOnlyList<double> Spacing { get; init; }

    /// <summary>1-σ of each entry of <see cref="Spacing"/>.</summary>
    public required IReadOnlyList<double> Sigma { get; init; }

    /// <summary>True when entries are indexed by the box's hardware count (the log gave the
    /// run's origin count); false when by the run's own count from its origin.</summary>
    public required bool IndexedByHardwareCount { get; init; }

    /// <summary>Tooth intervals used.</summary>
    public required int Intervals { get; init; }

    /// <summary>Revolutions the intervals add up to.</summary>
    public double Revolutions => (double)Intervals / PulsesPerRevolution;

    /// <summary>Mean speed over the intervals used, m/s (with the log's circumference).</summary>
    public required double MeanSpeedMps { get; init; }

    /// <summary>Median width of the pulse observations' brackets, seconds.</summary>
    public required double MedianBracketS { get; init; }

    /// <summary>1-σ of one interval's relative length from the brackets alone (two uniform
    /// bracket errors: width/√6 over the median interval).</summary>
    public required double BracketNoiseFraction { get; init; }

    /// <summary>True when the two halves of the cruise gave maps that differ beyond their noise
    /// (a pulse lost or doubled, or the ring moved).</summary>
    public bool HalvesDisagree { get; init; }

    /// <summary>What the reader should know, one sentence each.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>Largest |spacing − 1|.</summary>
    public double MaxDeviation => Spacing.Max(s => Math.Abs(s - 1));

    /// <summary>Root mean square of spacing − 1.</summary>
    public double RmsDeviation => Math.Sqrt(Spacing.Average(s => (s - 1) * (s - 1)));
}
