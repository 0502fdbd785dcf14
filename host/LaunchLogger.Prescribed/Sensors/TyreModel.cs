namespace LaunchLogger.Prescribed.Sensors;

/// <summary>How far the wheel travels per revolution, against what the user stated.</summary>
/// <remarks>The true circumference at speed v is
/// <code>C(v) = C_rest·(1 + g·(v / 30 m/s)²)</code>
/// where C_rest is the rolling circumference at walking pace and g the fractional growth at
/// 30 m/s (a tyre grows with speed as the tread is flung outward; common practice, quadratic
/// in speed from memory). The decoder is told <see cref="StatedCircumferenceM"/>: equal to
/// C_rest and with no growth when the tyre was calibrated at speed, otherwise the static
/// (unloaded) circumference, which is larger than the rolling one.</remarks>
/// <param name="StatedCircumferenceM">What the decoder is told, m.</param>
/// <param name="RollingAtRestM">C_rest, m.</param>
/// <param name="GrowthAt30Mps">g, a fraction (0.004 = 0.4 % at 30 m/s).</param>
public sealed record TyreModel(double StatedCircumferenceM, double RollingAtRestM, double GrowthAt30Mps)
{
    /// <summary>The speed the growth is stated at, m/s.</summary>
    public const double GrowthReferenceMps = 30;

    /// <summary>A tyre calibrated at speed: exactly the stated circumference at every speed.</summary>
    public static TyreModel Calibrated(double circumferenceM) => new(circumferenceM, circumferenceM, 0);

    /// <summary>True when the circumference does not change with speed.</summary>
    public bool Rigid => GrowthAt30Mps == 0;

    /// <summary>C(v), m.</summary>
    public double CircumferenceAt(double speedMps)
    {
        double r = speedMps / GrowthReferenceMps;
        return RollingAtRestM * (1 + (GrowthAt30Mps * r * r));
    }
}
