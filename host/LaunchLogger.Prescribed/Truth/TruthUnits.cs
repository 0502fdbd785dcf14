namespace LaunchLogger.Prescribed.Truth;

/// <summary>Exact unit factors the generator states its figures in, kept here so that the truth
/// does not borrow the decoder's constants.</summary>
public static class TruthUnits
{
    /// <summary>1 ft = 0.3048 m exactly (international yard and pound agreement, 1959).</summary>
    public const double MetresPerFoot = 0.3048;

    /// <summary>1 mph = 0.44704 m/s exactly (1 statute mile = 1609.344 m; same agreement).</summary>
    public const double MpsPerMph = 0.44704;

    /// <summary>1 km/h = 1/3.6 m/s.</summary>
    public const double MpsPerKmh = 1 / 3.6;

    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901; ISO 80000-3).</summary>
    public const double StandardGravity = 9.80665;

    /// <summary>The drag-strip rollout, one foot (common practice; SAE J1491 §3.3 "initial
    /// vehicle movement").</summary>
    public const double RolloutM = MetresPerFoot;
}
