using System.Globalization;

namespace LaunchLogger.Decoding.Metrics;

/// <summary>A speed interval to time, e.g. 0–60 mph or 80–120 km/h.</summary>
/// <param name="Label">How people write it, e.g. "0-60 mph".</param>
/// <param name="FromMps">Start speed, m/s (0 for a standing start).</param>
/// <param name="ToMps">End speed, m/s.</param>
public sealed record SpeedInterval(string Label, double FromMps, double ToMps)
{
    /// <summary>True for an interval from standstill, the only kind the two conventions time differently.</summary>
    public bool IsStanding => FromMps == 0;

    /// <summary>Makes an interval in mph.</summary>
    public static SpeedInterval Mph(double from, double to) =>
        new(Format(from, to, "mph"), from * Units.MpsPerMph, to * Units.MpsPerMph);

    /// <summary>Makes an interval in km/h.</summary>
    public static SpeedInterval Kmh(double from, double to) =>
        new(Format(from, to, "km/h"), from * Units.MpsPerKmh, to * Units.MpsPerKmh);

    /// <summary>Parses "FROM-TO UNIT" where UNIT is mph or km/h (also "kmh", "kph"), e.g.
    /// "40-80mph" or "0-150 km/h".</summary>
    /// <exception cref="FormatException">The text is not such an interval; the message says why.</exception>
    public static SpeedInterval Parse(string text)
    {
        string s = text.Trim().ToLowerInvariant().Replace(" ", "");
        bool mph = s.EndsWith("mph", StringComparison.Ordinal);
        string unit = mph ? "mph" : s.EndsWith("km/h", StringComparison.Ordinal) ? "km/h" : s.EndsWith("kmh", StringComparison.Ordinal) ? "kmh" : s.EndsWith("kph", StringComparison.Ordinal) ? "kph" : "";
        if (unit.Length == 0)
        {
            throw new FormatException($"interval '{text}' needs a unit: mph or km/h (e.g. 40-80mph)");
        }

        string[] parts = s[..^unit.Length].Split('-');
        if (parts.Length != 2
            || !double.TryParse(parts[0], NumberStyles.Float, CultureInfo.InvariantCulture, out double from)
            || !double.TryParse(parts[1], NumberStyles.Float, CultureInfo.InvariantCulture, out double to))
        {
            throw new FormatException($"interval '{text}' is not FROM-TO with numbers (e.g. 40-80mph)");
        }

        if (from < 0 || to <= from)
        {
            throw new FormatException($"interval '{text}' must rise from a speed ≥ 0 to a higher one");
        }

        return mph ? Mph(from, to) : Kmh(from, to);
    }

    private static string Format(double from, double to, string unit) =>
        string.Create(CultureInfo.InvariantCulture, $"{from:0.##}-{to:0.##} {unit}");
}
