namespace LaunchLogger.Decoding.Corrections;

/// <summary>The road's slope along the car at staging.</summary>
/// <param name="AngleRad">Slope angle, radians, uphill positive.</param>
/// <param name="SigmaRad">1-σ of the angle, radians.</param>
/// <param name="MountingCalibrated">True when a calibrated mounting pitch was subtracted; false
/// when the box was taken as mounted level (the estimate then carries the mounting error).</param>
public sealed record GradeEstimate(double AngleRad, double SigmaRad, bool MountingCalibrated)
{
    /// <summary>Slope in percent (rise over run × 100), uphill positive.</summary>
    public double Percent => Math.Tan(AngleRad) * 100;

    /// <summary>Slope in degrees, uphill positive.</summary>
    public double Degrees => AngleRad * 180 / Math.PI;

    /// <summary>σ of an uncalibrated box's pitch as the grade sees it: a box set level by eye on
    /// its bracket sits within about 2° (common practice), and the forward axis' zero-g offset,
    /// some 20 mg for consumer MEMS parts (from memory), reads as another 1.15°; together 2.3°,
    /// radians. A calibrated mounting pitch (which includes the offset) replaces it.</summary>
    public const double UncalibratedMountingSigmaRad = 2.3 * Math.PI / 180;

    /// <summary>Grade from the resting pitch at staging minus the box's calibrated mounting pitch.</summary>
    /// <param name="restingPitchRad">Pitch of the box at rest (nose up positive), with its σ.</param>
    /// <param name="mountingPitchRad">Calibrated mounting pitch, or null to take the box as level.</param>
    /// <param name="mountingPitchSigmaRad">σ of the calibrated mounting pitch.</param>
    /// <param name="uncalibratedSigmaRad">σ assumed for an uncalibrated mounting (default
    /// <see cref="UncalibratedMountingSigmaRad"/>).</param>
    public static GradeEstimate FromRest(Estimate restingPitchRad, double? mountingPitchRad, double mountingPitchSigmaRad = 0, double uncalibratedSigmaRad = UncalibratedMountingSigmaRad)
    {
        bool calibrated = mountingPitchRad is not null;
        double angle = restingPitchRad.Value - (mountingPitchRad ?? 0);
        double mountingSigma = calibrated ? mountingPitchSigmaRad : uncalibratedSigmaRad;
        return new GradeEstimate(angle, Math.Sqrt((restingPitchRad.Sigma * restingPitchRad.Sigma) + (mountingSigma * mountingSigma)), calibrated);
    }
}
