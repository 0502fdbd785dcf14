namespace LaunchLogger.Decoding.Corrections;

/// <summary>Air on the day: the International Standard Atmosphere, humid-air density and the
/// engine power correction factor.</summary>
/// <remarks>
/// ISA: ICAO Doc 7488 / US Standard Atmosphere 1976 — T0 = 288.15 K, p0 = 101 325 Pa,
/// ρ0 = 1.225 kg/m³, lapse 6.5 K/km below 11 km; in that layer
/// p/p0 = (1 − L·h/T0)^(g0/(R·L)) and ρ/ρ0 = (1 − L·h/T0)^(g0/(R·L) − 1), whose inverses are
/// the altitude formulas below (44330.77 m = T0/L; exponents 0.1902632 and 0.2349692).
/// Saturation vapour pressure: Buck (1981). Humid-air density: partial pressures of dry air and
/// water vapour, R_d = 287.058 and R_v = 461.495 J/(kg·K).
/// Power correction: SAE J1349, JUN1990 form, to 25 °C and 99 kPa dry air,
/// CF = 1.18·(99/p_d)·√((T+273)/298) − 0.18 (about 85 % mechanical efficiency: indicated power
/// scales with p_d/√T, friction does not). Later revisions write 1.176/0.176; the two differ by
/// 0.004·(x − 1), at most about 0.0013 for tracks below 2000 m. The 1990 form is used because its
/// coefficients are the ones confirmed with their revision date.
/// </remarks>
public static class Atmosphere
{
    /// <summary>ISA sea-level pressure, Pa.</summary>
    public const double SeaLevelPressurePa = 101325;

    /// <summary>ISA sea-level density, kg/m³.</summary>
    public const double SeaLevelDensity = 1.225;

    /// <summary>ISA sea-level temperature, K.</summary>
    public const double SeaLevelTemperatureK = 288.15;

    /// <summary>Specific gas constant of dry air, J/(kg·K).</summary>
    public const double DryAirGasConstant = 287.058;

    /// <summary>Specific gas constant of water vapour, J/(kg·K).</summary>
    public const double VapourGasConstant = 461.495;

    private const double ScaleHeightM = 44330.77;
    private const double PressureExponent = 0.1902632;
    private const double DensityExponent = 0.2349692;

    /// <summary>Pressure altitude: the ISA altitude with this static pressure, m.</summary>
    public static double PressureAltitudeM(double pressurePa) =>
        ScaleHeightM * (1 - Math.Pow(pressurePa / SeaLevelPressurePa, PressureExponent));

    /// <summary>Density altitude: the ISA altitude with this air density, m.</summary>
    public static double DensityAltitudeM(double densityKgPerM3) =>
        ScaleHeightM * (1 - Math.Pow(densityKgPerM3 / SeaLevelDensity, DensityExponent));

    /// <summary>Saturation vapour pressure over water (Buck 1981), Pa.</summary>
    public static double SaturationVapourPressurePa(double temperatureC) =>
        611.21 * Math.Exp(17.502 * temperatureC / (240.97 + temperatureC));

    /// <summary>Partial pressure of water vapour at a relative humidity, Pa.</summary>
    public static double VapourPressurePa(double temperatureC, double relativeHumidityPct) =>
        relativeHumidityPct / 100 * SaturationVapourPressurePa(temperatureC);

    /// <summary>Density of humid air, kg/m³.</summary>
    public static double HumidAirDensity(double temperatureC, double pressurePa, double relativeHumidityPct)
    {
        double temperatureK = temperatureC + 273.15;
        double vapour = VapourPressurePa(temperatureC, relativeHumidityPct);
        return ((pressurePa - vapour) / (DryAirGasConstant * temperatureK)) + (vapour / (VapourGasConstant * temperatureK));
    }

    /// <summary>SAE J1349 (JUN1990 form) power correction factor to 25 °C and 99 kPa of dry air.</summary>
    /// <param name="dryPressureKPa">Dry-air partial pressure, kPa.</param>
    /// <param name="temperatureC">Intake air temperature, °C.</param>
    public static double J1349CorrectionFactor(double dryPressureKPa, double temperatureC) =>
        (1.18 * (99 / dryPressureKPa) * Math.Sqrt((temperatureC + 273) / 298)) - 0.18;
}
