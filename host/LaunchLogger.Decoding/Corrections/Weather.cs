using System.Globalization;

namespace LaunchLogger.Decoding.Corrections;

/// <summary>Weather during a run and what follows from it.</summary>
/// <param name="TemperatureC">Air temperature, °C.</param>
/// <param name="PressureHPa">Station (not sea-level-corrected) pressure, hPa.</param>
/// <param name="RelativeHumidityPct">Relative humidity, %.</param>
public sealed record Weather(double TemperatureC, double PressureHPa, double RelativeHumidityPct)
{
    /// <summary>Humid-air density, kg/m³.</summary>
    public double DensityKgPerM3 => Atmosphere.HumidAirDensity(TemperatureC, PressureHPa * 100, RelativeHumidityPct);

    /// <summary>Density altitude (ISA), m.</summary>
    public double DensityAltitudeM => Atmosphere.DensityAltitudeM(DensityKgPerM3);

    /// <summary>Dry-air partial pressure, kPa.</summary>
    public double DryPressureKPa => ((PressureHPa * 100) - Atmosphere.VapourPressurePa(TemperatureC, RelativeHumidityPct)) / 1000;

    /// <summary>SAE J1349 power correction factor.</summary>
    public double CorrectionFactor => Atmosphere.J1349CorrectionFactor(DryPressureKPa, TemperatureC);

    /// <summary>Parses "T_C,P_hPa,RH_pct", e.g. "18.5,1008,62".</summary>
    /// <exception cref="FormatException">Not three numbers in plausible ranges; the message says which.</exception>
    public static Weather Parse(string text)
    {
        string[] parts = text.Split(',');
        if (parts.Length != 3)
        {
            throw new FormatException($"weather '{text}' must be three numbers: temperature °C, pressure hPa, humidity % (e.g. 18.5,1008,62)");
        }

        double t = Number(parts[0], "temperature", -40, 60);
        double p = Number(parts[1], "pressure", 500, 1100);
        double rh = Number(parts[2], "humidity", 0, 100);
        return new Weather(t, p, rh);

        double Number(string s, string name, double min, double max)
        {
            if (!double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out double v))
            {
                throw new FormatException($"weather {name} '{s}' is not a number");
            }

            // Written so that NaN fails too (every comparison with NaN is false).
            if (!(v >= min && v <= max))
            {
                throw new FormatException(string.Create(CultureInfo.InvariantCulture, $"weather {name} {v} is outside {min} to {max}"));
            }

            return v;
        }
    }
}
