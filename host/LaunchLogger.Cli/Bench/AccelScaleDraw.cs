using LaunchLogger.Decoding;

namespace LaunchLogger.Cli.Bench;

/// <summary>The accelerometer's forward scale error of one benchmark run, and what a user who
/// calibrated it against gravity would tell the tool: the truth plus the calibration's own error,
/// drawn with its σ.</summary>
/// <remarks>Consumer MEMS accelerometers hold their scale to about 1 % (1 σ; common practice,
/// the same figure as <c>ReconstructionOptions.AccelScaleSigma</c>); two rests against gravity
/// bring it to about 0.2 % (the orientation's cosine, the local gravity, the resting noise).</remarks>
public static class AccelScaleDraw
{
    /// <summary>1-σ of the scale error drawn, a fraction.</summary>
    public const double ScaleErrorSigma = 0.01;

    /// <summary>1-σ of the calibration told, a fraction.</summary>
    public const double CalibrationSigma = 0.002;

    /// <summary>Draws the scale error and the calibration told (both always, so that the stream
    /// stays the same with or without <paramref name="calibrated"/>).</summary>
    /// <returns>The scale error (reads 1 + error times the force) and the calibration told, null
    /// when not <paramref name="calibrated"/>.</returns>
    public static (double ScaleError, Estimate? Told) Draw(Random random, bool calibrated)
    {
        ArgumentNullException.ThrowIfNull(random);
        double error = ScaleErrorSigma * Gaussian(random);
        double told = 1 + error + (CalibrationSigma * Gaussian(random));
        return (error, calibrated ? new Estimate(told, CalibrationSigma) : null);
    }

    /// <summary>The analysis options that tell the calibrations a user would have: the forward
    /// axis' scale (<paramref name="accel"/>) and a measured rolling circumference
    /// (<paramref name="tyre"/>, metres, as <see cref="TyreCalibrationTold"/> gives it), or else the
    /// static circumference the box holds, told as such (<paramref name="staticTyreM"/>), and the
    /// pickup's wheel (<paramref name="pickupWheel"/>); null for none.</summary>
    public static Decoding.Analysis.AnalysisOptions? Options(Estimate? accel, Estimate? tyre = null, double? staticTyreM = null, Decoding.Reconstruction.PickupWheel? pickupWheel = null) => accel is null && tyre is null && staticTyreM is null && pickupWheel is null
        ? null
        : new Decoding.Analysis.AnalysisOptions
        {
            Calibration = new Decoding.Calibration.CalibrationSettings
            {
                AccelForwardScale = accel?.Value,
                AccelForwardScaleSigma = accel?.Sigma,
                CircumferenceM = tyre?.Value,
                CircumferenceSigmaM = tyre?.Sigma,
                StaticCircumferenceM = tyre is null ? staticTyreM : null,
                PickupWheel = pickupWheel,
            },
        };

    // Box–Muller (G. E. P. Box, M. E. Muller, 1958).
    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
