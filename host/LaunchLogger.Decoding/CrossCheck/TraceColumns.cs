using System.Globalization;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Which columns of another instrument's CSV export hold what, and in which units.</summary>
/// <remarks>Written on the command line as <c>time=COL,speed=COL[,lat=COL,lon=COL]</c> with
/// column names as in the file's header; units separately (speed in mph, kmh, mps or knots; time
/// in s or ms).</remarks>
public sealed record TraceColumns
{
    /// <summary>The header of the time column.</summary>
    public required string Time { get; init; }

    /// <summary>The header of the speed column, or null to difference the positions.</summary>
    public string? Speed { get; init; }

    /// <summary>The header of the latitude column (decimal degrees), or null.</summary>
    public string? Latitude { get; init; }

    /// <summary>The header of the longitude column (decimal degrees), or null.</summary>
    public string? Longitude { get; init; }

    /// <summary>m/s per unit of the speed column.</summary>
    public double MpsPerSpeedUnit { get; init; } = 1;

    /// <summary>Seconds per unit of the time column.</summary>
    public double SecondsPerTimeUnit { get; init; } = 1;

    /// <summary>Parses <c>time=COL,speed=COL[,lat=COL,lon=COL]</c>.</summary>
    /// <exception cref="FormatException">Unknown keys, a missing time column, or neither speed nor both positions.</exception>
    public static TraceColumns Parse(string map, string speedUnit = "mps", string timeUnit = "s")
    {
        var keys = new Dictionary<string, string>(StringComparer.OrdinalIgnoreCase);
        foreach (string part in map.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            int eq = part.IndexOf('=');
            string key = eq > 0 ? part[..eq].Trim() : string.Empty;
            if (eq <= 0 || eq == part.Length - 1 || key is not ("time" or "speed" or "lat" or "lon") || !keys.TryAdd(key, part[(eq + 1)..].Trim()))
            {
                throw new FormatException($"column map '{map}': each item must be one of time=, speed=, lat=, lon= followed by a header name, once each");
            }
        }

        if (!keys.ContainsKey("time"))
        {
            throw new FormatException($"column map '{map}' names no time column (time=HEADER)");
        }

        if (!keys.ContainsKey("speed") && !(keys.ContainsKey("lat") && keys.ContainsKey("lon")))
        {
            throw new FormatException($"column map '{map}' needs speed=HEADER, or both lat= and lon=");
        }

        return new TraceColumns
        {
            Time = keys["time"],
            Speed = keys.GetValueOrDefault("speed"),
            Latitude = keys.GetValueOrDefault("lat"),
            Longitude = keys.GetValueOrDefault("lon"),
            MpsPerSpeedUnit = speedUnit.ToLowerInvariant() switch
            {
                "mph" => Units.MpsPerMph,
                "kmh" or "km/h" => Units.MpsPerKmh,
                "mps" or "m/s" => 1,
                "knots" or "kn" => 1852.0 / 3600.0,
                _ => throw new FormatException($"speed unit '{speedUnit}' must be mph, kmh, mps or knots"),
            },
            SecondsPerTimeUnit = timeUnit.ToLowerInvariant() switch
            {
                "s" => 1,
                "ms" => 0.001,
                _ => throw new FormatException($"time unit '{timeUnit}' must be s or ms"),
            },
        };
    }

    /// <summary>A value of the map as text, for messages.</summary>
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"time={Time},speed={Speed},lat={Latitude},lon={Longitude}");
}
