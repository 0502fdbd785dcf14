namespace LaunchLogger.Decoding.Calibration;

/// <summary>A rolling circumference measured by rolling over a taped distance, with its
/// uncertainty and what it changes against the box's configured value.</summary>
public sealed record CircumferenceCalibration
{
    /// <summary>The taped distance, m.</summary>
    public required double DistanceM { get; init; }

    /// <summary>The stated 1-σ of the taped distance (tape and line-up), m.</summary>
    public required double TapeSigmaM { get; init; }

    /// <summary>The rolls averaged.</summary>
    public required IReadOnlyList<RollMeasurement> Rolls { get; init; }

    /// <summary>Mean pulses counted over the distance.</summary>
    public required double MeanPulses { get; init; }

    /// <summary>Pulses per wheel revolution.</summary>
    public required int PulsesPerRevolution { get; init; }

    /// <summary>The measured rolling circumference, m.</summary>
    public required double CircumferenceM { get; init; }

    /// <summary>1-σ of <see cref="CircumferenceM"/>, m: counting (or the repeats' scatter, when
    /// larger) and tape combined in quadrature.</summary>
    public required double SigmaM { get; init; }

    /// <summary>The counting part of <see cref="SigmaM"/>, m.</summary>
    public required double CountingSigmaM { get; init; }

    /// <summary>The tape's part of <see cref="SigmaM"/>, m.</summary>
    public required double TapeSigmaPartM { get; init; }

    /// <summary>Largest minus smallest count of the rolls as a fraction of the mean (0 for one roll).</summary>
    public required double SpreadFraction { get; init; }

    /// <summary>The circumference the box was configured with, m.</summary>
    public required double ConfiguredCircumferenceM { get; init; }

    /// <summary>Distance per pulse with the measured circumference, m.</summary>
    public double MetresPerPulse => CircumferenceM / PulsesPerRevolution;

    /// <summary>Measured minus configured circumference, m.</summary>
    public double ChangeM => CircumferenceM - ConfiguredCircumferenceM;

    /// <summary><see cref="ChangeM"/> as a fraction of the configured circumference.</summary>
    public double ChangeFraction => ChangeM / ConfiguredCircumferenceM;

    /// <summary>What the reader should know, one sentence each.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}
