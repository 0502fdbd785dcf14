using System.Globalization;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;
using UnitsNet;

namespace LaunchLogger.Tests.Shared;

/// <summary>Checks the numbers a page shows against the report document: every number on a card
/// sits in an element whose <c>data-src</c> names the JSON field it shows (relative to the run's
/// entry, or from the document's root when it starts with "/"). The shown text is read back to SI
/// with UnitsNet (an outside reference library for the unit factors) and must equal the JSON value
/// to within half a unit of the last digit shown.</summary>
internal static partial class PageNumbers
{
    /// <summary>One number shown: its field path and its text.</summary>
    public sealed record Shown(string Path, string Text);

    /// <summary>Checks every shown number; returns how many were checked. Absolute paths are
    /// checked only when <paramref name="document"/> is given.</summary>
    public static int CheckAll(IEnumerable<Shown> shown, JsonNode run, JsonNode? document, bool imperial)
    {
        int checkedCount = 0;
        foreach (Shown s in shown)
        {
            JsonNode? root = s.Path.StartsWith('/') ? document : run;
            if (root is null)
            {
                continue;
            }

            JsonNode? node = Resolve(root, s.Path.TrimStart('/'));
            Assert.True(node is not null, $"{s.Path}: the report has no value here, but the page shows '{s.Text}'");
            double expected = node!.GetValue<double>();
            (double si, double halfStep) = ToSi(s.Text, imperial);
            Assert.True(Math.Abs(si - expected) <= (halfStep * 1.000001) + 1e-12,
                $"{s.Path}: the page shows '{s.Text}' = {si.ToString("R", CultureInfo.InvariantCulture)} SI, the report has {expected.ToString("R", CultureInfo.InvariantCulture)} (allowed ±{halfStep.ToString("R", CultureInfo.InvariantCulture)})");
            checkedCount++;
        }

        return checkedCount;
    }

    /// <summary>The node at a path of names and indexes separated by "/".</summary>
    public static JsonNode? Resolve(JsonNode root, string path)
    {
        JsonNode? node = root;
        foreach (string part in path.Split('/', StringSplitOptions.RemoveEmptyEntries))
        {
            node = node is JsonArray array && int.TryParse(part, NumberStyles.None, CultureInfo.InvariantCulture, out int i)
                ? (i < array.Count ? array[i] : null)
                : node?[part];
            if (node is null)
            {
                return null;
            }
        }

        return node;
    }

    /// <summary>A shown quantity in SI, and half a unit of its last shown digit in SI.</summary>
    public static (double Si, double HalfStep) ToSi(string text, bool imperial)
    {
        Match m = NumberAndUnit().Match(text);
        Assert.True(m.Success, $"no number in '{text}'");
        string number = m.Groups["n"].Value;
        double value = double.Parse(number, NumberStyles.Float, CultureInfo.InvariantCulture);
        int decimals = number.Contains('.', StringComparison.Ordinal) ? number.Length - number.IndexOf('.', StringComparison.Ordinal) - 1 : 0;
        double step = 0.5 * Math.Pow(10, -decimals);
        string unit = m.Groups["u"].Value;
        if (unit.Length == 0 && text.TrimStart().StartsWith('±'))
        {
            // A speed's σ is shown bare, in the page's speed unit.
            unit = imperial ? "mph" : "km/h";
        }

        Func<double, double> toSi = unit switch
        {
            "s" => v => Duration.FromSeconds(v).Seconds,
            "ms" => v => Duration.FromMilliseconds(v).Seconds,
            "mph" => v => Speed.FromMilesPerHour(v).MetersPerSecond,
            "km/h" => v => Speed.FromKilometersPerHour(v).MetersPerSecond,
            "ft" => v => Length.FromFeet(v).Meters,
            "m" => v => v,
            "mm" => v => Length.FromMillimeters(v).Meters,
            "m/s²" => v => Acceleration.FromMetersPerSecondSquared(v).MetersPerSecondSquared,
            "hPa" => v => Pressure.FromHectopascals(v).Hectopascals,
            "°C" => v => Temperature.FromDegreesCelsius(v).DegreesCelsius,
            "kg/m³" => v => Density.FromKilogramsPerCubicMeter(v).KilogramsPerCubicMeter,
            "Hz" or "%" or "" => v => v,
            _ => throw new Xunit.Sdk.XunitException($"unknown unit '{unit}' in '{text}'"),
        };
        return (toSi(value), Math.Abs(toSi(step) - toSi(0)));
    }

    [GeneratedRegex(@"(?<n>[+-]?\d+(?:\.\d+)?)\s*(?<u>ms|s|mph|km/h|ft|mm|m/s²|m|hPa|°C|kg/m³|Hz|%)?")]
    private static partial Regex NumberAndUnit();
}
