namespace LaunchLogger.Decoding.Calibration;

/// <summary>A saved tooth-spacing map as the reconstruction takes it: each gap's relative length
/// (mean 1) and its 1-σ, numbered from a tooth of the ring the run does not know (the
/// reconstruction turns it to the run: <see cref="ToothSpacingCalibration.Align"/>).</summary>
/// <param name="Spacing">Relative length of each gap.</param>
/// <param name="Sigma">1-σ of each entry.</param>
public sealed record ToothGaps(IReadOnlyList<double> Spacing, IReadOnlyList<double> Sigma)
{
    /// <summary>σ taken for a saved map's entries when the settings give none: the most the
    /// map's own measurement lets the brackets leave per tooth
    /// (<see cref="ToothSpacingCalibration.MaxBracketNoisePerTooth"/>).</summary>
    public const double DefaultSigma = ToothSpacingCalibration.MaxBracketNoisePerTooth;

    /// <summary>The settings' map, or null when they hold none.</summary>
    public static ToothGaps? From(CalibrationSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        return settings.ToothSpacing is { Count: > 1 } spacing
            ? new ToothGaps(spacing, settings.ToothSpacingSigma is { } sigma && sigma.Count == spacing.Count ? sigma : [.. spacing.Select(_ => DefaultSigma)])
            : null;
    }
}
