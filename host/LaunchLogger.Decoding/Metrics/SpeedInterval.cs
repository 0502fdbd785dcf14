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
        (string numbers, bool mph) = SplitUnit(text, "interval", "40-80mph");
        string[] parts = numbers.Split('-');
        if (parts.Length != 2
            || !double.TryParse(parts[0], NumberStyles.Float, CultureInfo.InvariantCulture, out double from)
            || !double.TryParse(parts[1], NumberStyles.Float, CultureInfo.InvariantCulture, out double to))
        {
            throw new FormatException($"interval '{text}' is not FROM-TO with numbers (e.g. 40-80mph)");
        }

        if (!(from >= 0 && to > from))
        {
            throw new FormatException($"interval '{text}' must rise from a speed ≥ 0 to a higher one");
        }

        SpeedInterval interval = mph ? Mph(from, to) : Kmh(from, to);
        if (!(interval.ToMps <= Runs.InputLimits.MaxPlausibleSpeedMps))
        {
            throw new FormatException(string.Create(CultureInfo.InvariantCulture, $"interval '{text}' goes above {Runs.InputLimits.MaxPlausibleSpeedMps} m/s, faster than any car"));
        }

        return interval;
    }

    /// <summary>Parses one speed with its unit, e.g. "50mph" or "80 km/h", into m/s.</summary>
    /// <exception cref="FormatException">Not a positive speed with mph or km/h.</exception>
    public static double ParseSpeedMps(string text)
    {
        (string number, bool mph) = SplitUnit(text, "speed", "50mph");
        if (!double.TryParse(number, NumberStyles.Float, CultureInfo.InvariantCulture, out double value) || !(value > 0))
        {
            throw new FormatException($"speed '{text}' is not a positive number with a unit (e.g. 50mph)");
        }

        double mps = value * (mph ? Units.MpsPerMph : Units.MpsPerKmh);
        if (!(mps <= Runs.InputLimits.MaxPlausibleSpeedMps))
        {
            throw new FormatException(string.Create(CultureInfo.InvariantCulture, $"speed '{text}' is above {Runs.InputLimits.MaxPlausibleSpeedMps} m/s, faster than any car"));
        }

        return mps;
    }

    private static (string Numbers, bool Mph) SplitUnit(string text, string what, string example)
    {
        string s = text.Trim().ToLowerInvariant().Replace(" ", "");
        foreach ((string unit, bool mph) in new[] { ("mph", true), ("km/h", false), ("kmh", false), ("kph", false) })
        {
            if (s.EndsWith(unit, StringComparison.Ordinal))
            {
                return (s[..^unit.Length], mph);
            }
        }

        throw new FormatException($"{what} '{text}' needs a unit: mph or km/h (e.g. {example})");
    }

    private static string Format(double from, double to, string unit) =>
        string.Create(CultureInfo.InvariantCulture, $"{from:0.##}-{to:0.##} {unit}");
}
