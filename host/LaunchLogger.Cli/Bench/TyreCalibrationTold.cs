using LaunchLogger.Decoding;

namespace LaunchLogger.Cli.Bench;

/// <summary>What the bench tells the decoder for a calibrated tyre: the true rolling
/// circumference, with the σ a user's measurement of it would carry.</summary>
/// <remarks>A roll over a taped 100 m is good to about 0.04 % from the count, 0.04 % from lining
/// up each end and a few centimetres from the tape (hardware-notes/calibration.md §1, "How good
/// is it?"); 0.1 % (1 σ) is told, a little more than those together, so the decoder treats the
/// tyre as a calibrated user's and keeps it unless a run measures it better. The value itself is
/// told exactly (the limit of a long, careful roll): a drawn 0.1 % error costs more than the
/// decoder's own errors on the standing figures (DEVELOPERS.md, "Where the accuracy stands"; the traces in
/// host/LaunchLogger.Decoding/ACCURACY-NOTES.md).</remarks>
public static class TyreCalibrationTold
{
    /// <summary>1-σ told with the circumference, a fraction.</summary>
    public const double CalibrationSigma = 0.001;

    /// <summary>The circumference told for a tyre rolling <paramref name="trueCircumferenceM"/>,
    /// with its σ, both in metres.</summary>
    public static Estimate Told(double trueCircumferenceM) => new(trueCircumferenceM, CalibrationSigma * trueCircumferenceM);
}
