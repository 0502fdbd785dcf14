namespace LaunchLogger.Decoding.Metrics;

/// <summary>The unit system a person reads: imperial (mph, ft) or metric (km/h, m). Shared by the
/// command line's tables and the plots, so both speak the same units.</summary>
public enum DisplayUnits
{
    /// <summary>mph and feet.</summary>
    Imperial,

    /// <summary>km/h and metres.</summary>
    Metric,
}

/// <summary>Conversions from SI to a <see cref="DisplayUnits"/> system, with the unit's name.</summary>
public static class DisplayUnitsScale
{
    /// <summary>m/s in one displayed speed unit (mph or km/h).</summary>
    public static double MpsPerSpeedUnit(this DisplayUnits units) => units == DisplayUnits.Imperial ? Units.MpsPerMph : Units.MpsPerKmh;

    /// <summary>Metres in one displayed distance unit (ft or m).</summary>
    public static double MetresPerDistanceUnit(this DisplayUnits units) => units == DisplayUnits.Imperial ? Units.MetresPerFoot : 1.0;

    /// <summary>The speed unit's name: "mph" or "km/h".</summary>
    public static string SpeedUnit(this DisplayUnits units) => units == DisplayUnits.Imperial ? "mph" : "km/h";

    /// <summary>The distance unit's name: "ft" or "m".</summary>
    public static string DistanceUnit(this DisplayUnits units) => units == DisplayUnits.Imperial ? "ft" : "m";

    /// <summary>A speed in m/s in the displayed unit.</summary>
    public static double Speed(this DisplayUnits units, double mps) => mps / units.MpsPerSpeedUnit();

    /// <summary>A distance in metres in the displayed unit.</summary>
    public static double Distance(this DisplayUnits units, double metres) => metres / units.MetresPerDistanceUnit();
}
