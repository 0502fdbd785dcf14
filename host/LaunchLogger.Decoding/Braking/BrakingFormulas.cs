using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Braking;

/// <summary>Closed-form braking arithmetic.</summary>
public static class BrakingFormulas
{
    /// <summary>Mean deceleration of a stop from <paramref name="speedMps"/> in
    /// <paramref name="distanceM"/>: v² / 2d (kinematics, any textbook).</summary>
    public static double MeanDecelerationMps2(double speedMps, double distanceM) =>
        speedMps * speedMps / (2 * distanceM);

    /// <summary>Where the MFDD window begins, as a fraction of the initial speed (UN R13-H: v_b = 0.8·v0).</summary>
    public const double MfddWindowStartFraction = 0.8;

    /// <summary>Where the MFDD window ends, as a fraction of the initial speed (UN R13-H: v_e = 0.1·v0).</summary>
    public const double MfddWindowEndFraction = 0.1;

    /// <summary>The name every table, card and plot gives <see cref="Mfdd"/>: the formula and
    /// window are UN Regulation No. 13-H's (braking of passenger cars, Annex 3), the regulation
    /// for the cars this tool times; UN R13, for heavier vehicles, uses the same formula (from
    /// memory).</summary>
    public const string MfddLabel = "MFDD (UN R13-H)";

    /// <summary>Mean fully developed deceleration, m/s², by UN Regulation No. 13-H (13 alike):
    /// d_m = (v_b² − v_e²) / (25.92 · (s_e − s_b)), speeds in km/h, v_b = 0.8·v0, v_e = 0.1·v0,
    /// s_b and s_e the distances (m) travelled from v0 to v_b and to v_e.</summary>
    public static double Mfdd(double initialSpeedKmh, double distanceToVbM, double distanceToVeM)
    {
        double vb = MfddWindowStartFraction * initialSpeedKmh;
        double ve = MfddWindowEndFraction * initialSpeedKmh;
        return ((vb * vb) - (ve * ve)) / (25.92 * (distanceToVeM - distanceToVbM));
    }

    /// <summary>A stopping distance scaled to a nominal initial speed with (v_nom / v_act)²
    /// (common practice; exact only for constant deceleration without dead time).</summary>
    public static double CorrectToNominalSpeed(double distanceM, double actualSpeedMps, double nominalSpeedMps) =>
        distanceM * (nominalSpeedMps / actualSpeedMps) * (nominalSpeedMps / actualSpeedMps);

    /// <summary>The best time from rest to <paramref name="targetSpeedMps"/> that the grip of a
    /// stop with mean deceleration <paramref name="meanDecelerationMps2"/> would allow if the car
    /// could accelerate as hard as it brakes: t = v / a.</summary>
    public static double TractionBoundS(double targetSpeedMps, double meanDecelerationMps2) =>
        targetSpeedMps / meanDecelerationMps2;

    /// <summary>The traction bound for 0–60 mph from a stop from 60 mph in
    /// <paramref name="distanceM"/>: t = 2d / v.</summary>
    public static double TractionBound0To60FromStopS(double distanceM) => 2 * distanceM / (60 * Units.MpsPerMph);
}
