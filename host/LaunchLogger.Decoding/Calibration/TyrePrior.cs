namespace LaunchLogger.Decoding.Calibration;

/// <summary>What a tyre typically does that its static circumference does not say: taken when the
/// settings give a static (unloaded) circumference (<see cref="CalibrationSettings.StaticCircumferenceM"/>)
/// rather than a rolled one.</summary>
/// <remarks>
/// <para>A loaded radial tyre rolls on an effective radius between its loaded and its free radius
/// (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1, the effective rolling radius): it covers
/// less per turn than a tape round its tread says, about 0–2 % less on road tyres (from memory).
/// The middle of that range is taken, with <see cref="Reconstruction.ReconstructionOptions.CircumferenceSigmaFraction"/>
/// (1 %) around it, which also holds a tyre a little outside the range and a figure worked out
/// from the tyre's size rather than measured.</para>
/// <para>The tread grows outwards with speed: about 0.1–0.6 % at 30 m/s on radial road tyres
/// (from memory), growing with the square of speed; the middle is taken, with
/// <see cref="Reconstruction.ReconstructionOptions.TyreGrowthSigmaAt30Mps"/> (0.3 %) around it.</para>
/// <para>A rolled circumference (<see cref="CalibrationSettings.CircumferenceM"/>) is a measurement:
/// nothing is added to it but σ.</para>
/// </remarks>
public static class TyrePrior
{
    /// <summary>Rolling over static circumference taken for a loaded tyre.</summary>
    public const double RollingOverStatic = 0.99;

    /// <summary>Growth of the rolling radius at 30 m/s taken for a tyre not measured at speed, a fraction.</summary>
    public const double GrowthAt30Mps = 0.0035;
}
