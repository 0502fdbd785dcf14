using System.Globalization;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Cli.Output;

/// <summary>Formats SI values for people.</summary>
public static class Format
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    /// <summary>A speed with its unit, e.g. "61.2 mph".</summary>
    public static string Speed(double? mps, DisplayUnits units) => mps is not { } v
        ? "—"
        : units.Speed(v).ToString("0.0", Invariant) + " " + units.SpeedUnit();

    /// <summary>A speed's uncertainty in the same unit, e.g. "± 0.1".</summary>
    public static string SpeedSigma(double? mps, DisplayUnits units) => mps is not { } v
        ? ""
        : "± " + units.Speed(v).ToString("0.0#", Invariant);

    /// <summary>A distance with its unit, e.g. "402.34 m" or "1320 ft": metres always to the
    /// centimetre, so every metric distance in a report reads with the same precision.</summary>
    public static string Distance(double metres, DisplayUnits units) => units == DisplayUnits.Imperial
        ? (metres / Units.MetresPerFoot).ToString("0.#", Invariant) + " ft"
        : metres.ToString("0.00", Invariant) + " m";

    /// <summary>A duration, e.g. "5.472 s", or a dash when missing.</summary>
    public static string Seconds(double? s) => s is { } v ? v.ToString("0.000", Invariant) + " s" : "—";

    /// <summary>A duration with its uncertainty in milliseconds, e.g. "5.472 s ± 2.1 ms".</summary>
    public static string SecondsWithSigma(double? s, double? sigma) => s is not { } v
        ? "—"
        : sigma is { } u
            ? v.ToString("0.000", Invariant) + " s ± " + Milliseconds(u)
            : v.ToString("0.000", Invariant) + " s";

    /// <summary>Milliseconds, e.g. "2.1 ms".</summary>
    public static string Milliseconds(double s) => (s * 1000).ToString(s < 0.01 ? "0.0" : "0", Invariant) + " ms";

    /// <summary>An acceleration in m/s² and g, e.g. "7.35 m/s² (0.75 g)".</summary>
    public static string Accel(double? mps2) => mps2 is { } a
        ? a.ToString("0.00", Invariant) + " m/s² (" + (a / Units.StandardGravity).ToString("0.00", Invariant) + " g)"
        : "—";
}
