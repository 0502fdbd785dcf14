using System.Text.Json.Serialization;

namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The tyres: effective rolling radius and the longitudinal force-slip curve.</summary>
/// <remarks>The curve has the shape of Pacejka's "Magic Formula", μ(κ) = μp·sin(C·atan(B·κ)),
/// with C chosen so that the curve settles at <see cref="SlidingFrictionFraction"/> of the peak
/// at large slip and B so that the peak falls at <see cref="PeakSlip"/>.</remarks>
public sealed record TyreSpec
{
    /// <summary>Effective rolling radius at low speed (distance per radian of wheel turn), m.</summary>
    public double RollingRadiusM { get; init; } = 0.3;

    /// <summary>Growth of the effective rolling radius at 30 m/s, as a fraction; it grows with the
    /// square of speed (centrifugal growth of the tread).</summary>
    [JsonPropertyName("radius_growth_at_30_mps")]
    public double RadiusGrowthAt30Mps { get; init; } = 0.004;

    /// <summary>Peak friction coefficient μ between tyre and road.</summary>
    public double PeakFriction { get; init; } = 1.0;

    /// <summary>Slip ratio at which the friction peaks.</summary>
    public double PeakSlip { get; init; } = 0.1;

    /// <summary>Friction at full slide as a fraction of the peak (0.5–1).</summary>
    public double SlidingFrictionFraction { get; init; } = 0.8;
}
