using System.Globalization;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Metrics;

// Compiled into LaunchLogger.Pages (linked from there), which the command line references: the
// tables and the HTML pages show every figure alike. The namespace stays the command line's.
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

    /// <summary>Why a stop's distance was not corrected to a nominal speed, in the reader's units,
    /// e.g. "not corrected: onset speed 95.6 mph is more than 10 % from 60.0 mph" (the decoder's own
    /// note gives the speeds in m/s).</summary>
    public static string StopNotCorrected(double fromMps, double nominalMps, DisplayUnits units) =>
        $"not corrected: onset speed {Speed(fromMps, units)} is more than {(BrakingAnalyzer.CorrectionTolerance * 100).ToString("0", Invariant)} % from {Speed(nominalMps, units)}";

    /// <summary>A board's figure in its unit ("s", "m/s" or "m", SI), e.g. "5.472 s",
    /// "98.41 mph", "36.1 ft"; the bare number for a σ; empty when missing.</summary>
    public static string BoardValue(string unit, double? value, DisplayUnits units, bool sigma = false)
    {
        if (value is not { } v)
        {
            return "";
        }

        return unit switch
        {
            "m/s" => units == DisplayUnits.Imperial ? (v / Units.MpsPerMph).ToString("0.00", Invariant) + (sigma ? "" : " mph") : (v / Units.MpsPerKmh).ToString("0.00", Invariant) + (sigma ? "" : " km/h"),
            "m" => units == DisplayUnits.Imperial ? (v / Units.MetresPerFoot).ToString("0.0", Invariant) + (sigma ? "" : " ft") : v.ToString("0.00", Invariant) + (sigma ? "" : " m"),
            _ => v.ToString("0.000", Invariant) + (sigma ? "" : " s"),
        };
    }
}
