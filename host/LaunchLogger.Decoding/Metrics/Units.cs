namespace LaunchLogger.Decoding.Metrics;

/// <summary>Exact conversion factors used at the edges (parsing and formatting).</summary>
/// <remarks>International yard and pound agreement (1959): 1 ft = 0.3048 m, 1 mile = 1609.344 m,
/// so 1 mph = 0.44704 m/s. Standard gravity g0 = 9.80665 m/s² (3rd CGPM, 1901).</remarks>
public static class Units
{
    /// <summary>Metres in one international foot.</summary>
    public const double MetresPerFoot = 0.3048;

    /// <summary>Metres in one statute mile.</summary>
    public const double MetresPerMile = 1609.344;

    /// <summary>m/s in one mph.</summary>
    public const double MpsPerMph = 0.44704;

    /// <summary>m/s in one km/h.</summary>
    public const double MpsPerKmh = 1.0 / 3.6;

    /// <summary>Standard gravity, m/s².</summary>
    public const double StandardGravity = 9.80665;

    /// <summary>The drag-strip rollout: one foot, m.</summary>
    public const double RolloutM = MetresPerFoot;
}
