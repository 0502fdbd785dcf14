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

    /// <summary>1-σ scale error of each accelerometer axis, as a fraction (about 1 % for consumer
    /// MEMS parts; common practice). The pitch is read as asin(f_x / |f|): the forward axis' scale
    /// error s_x and the others' (through |f|, mostly the vertical axis' s_z) tilt it by about
    /// (s_x − s_z)·θ on a slope θ beyond what the mounting calibration on level ground took out,
    /// so √2 of this times the grade counts in σ.</summary>
    public const double AxisScaleSigma = 0.01;

    /// <summary>The body's pitch on its suspension per unit of along-road gravity, radians per g: on
    /// a slope θ the weight's component g0·sin θ acts at the centre of gravity above the tyres
    /// that hold the car, and pitches the body as an acceleration of sin θ g would (nose up
    /// uphill) — which the box, fixed to the body, reads as more slope. Cars pitch some 1–3° per
    /// g on their suspension (from memory); 0.05 rad (2.9°) per g as 1-σ covers them.</summary>
    public const double BodyPitchPerG = 0.05;

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
        double scaleSigma = Math.Sqrt(2) * AxisScaleSigma * angle;
        double bodySigma = BodyPitchPerG * Math.Sin(angle);
        return new GradeEstimate(angle, Math.Sqrt((restingPitchRad.Sigma * restingPitchRad.Sigma) + (mountingSigma * mountingSigma) + (scaleSigma * scaleSigma) + (bodySigma * bodySigma)), calibrated);
    }
}
