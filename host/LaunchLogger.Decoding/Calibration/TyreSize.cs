using System.Globalization;
using System.Text.RegularExpressions;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>A tyre's metric size marking, "width/aspect R rim" (205/55R16): section width in
/// millimetres, sidewall height as a percentage of it, rim diameter in inches.</summary>
/// <param name="WidthMm">Section width, mm.</param>
/// <param name="AspectPercent">Sidewall height over width, per cent.</param>
/// <param name="RimInches">Rim diameter, inches.</param>
public sealed partial record TyreSize(int WidthMm, int AspectPercent, double RimInches)
{
    private const double MmPerInch = 25.4;

    /// <summary>The unloaded outer diameter the marking gives, m: the rim plus two sidewalls,
    /// rim × 25.4 mm + 2 × width × aspect / 100 (the metric size designation of ISO 4000-1 and
    /// the ETRTO standards manual; the nominal figure, which a real tyre differs from by a
    /// per cent or so).</summary>
    public double DiameterM => ((RimInches * MmPerInch) + (2.0 * WidthMm * AspectPercent / 100)) / 1000;

    /// <summary>The unloaded circumference the marking gives, m.</summary>
    public double StaticCircumferenceM => Math.PI * DiameterM;

    /// <summary>Reads a marking such as 205/55R16, 205/55 R16, 225/40ZR18 or 195/65R15.5.</summary>
    /// <returns>The size, or null when <paramref name="text"/> is not a metric marking with
    /// plausible figures (width 100–400 mm, aspect 20–100 %, rim 10–24 in).</returns>
    public static TyreSize? Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        Match m = Marking().Match(text.Trim());
        if (!m.Success)
        {
            return null;
        }

        var size = new TyreSize(
            int.Parse(m.Groups["width"].Value, CultureInfo.InvariantCulture),
            int.Parse(m.Groups["aspect"].Value, CultureInfo.InvariantCulture),
            double.Parse(m.Groups["rim"].Value, CultureInfo.InvariantCulture));
        return size is { WidthMm: >= 100 and <= 400, AspectPercent: >= 20 and <= 100, RimInches: >= 10 and <= 24 } ? size : null;
    }

    [GeneratedRegex(@"^(?<width>\d{3})\s*/\s*(?<aspect>\d{2,3})\s*Z?R\s*(?<rim>\d{2}(\.\d)?)$", RegexOptions.IgnoreCase | RegexOptions.CultureInvariant)]
    private static partial Regex Marking();
}
