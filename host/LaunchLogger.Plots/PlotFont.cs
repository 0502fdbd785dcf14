using System.Reflection;
using ScottPlot;
using SkiaSharp;

namespace LaunchLogger.Plots;

/// <summary>The one typeface every chart uses, DejaVu Sans, loaded from this assembly (see
/// Fonts/LICENSE-DejaVu.txt) so that a machine without it, or with other fonts, draws the same
/// picture. It replaces ScottPlot's system font lookup for the whole process.</summary>
internal static class PlotFont
{
    /// <summary>The family name charts ask for (and SVG text names).</summary>
    public const string Family = "DejaVu Sans";

    private static readonly Lock Gate = new();
    private static bool registered;

    /// <summary>Makes the shipped typeface the only one ScottPlot resolves. Safe to call often and
    /// from several threads.</summary>
    public static void Register()
    {
        lock (Gate)
        {
            if (registered)
            {
                return;
            }

            var resolver = new EmbeddedFontResolver(Load("DejaVuSans.ttf"), Load("DejaVuSans-Bold.ttf"));
            Fonts.FontResolvers.Clear();
            Fonts.FontResolvers.Add(resolver);
            Fonts.Default = Family;
            Fonts.Sans = Family;
            Fonts.Serif = Family;
            Fonts.Monospace = Family;
            registered = true;
        }
    }

    private static SKTypeface Load(string file)
    {
        string name = "LaunchLogger.Plots.Fonts." + file;
        using Stream stream = Assembly.GetExecutingAssembly().GetManifestResourceStream(name)
            ?? throw new InvalidOperationException($"the font {name} is missing from the assembly");
        using var copy = new MemoryStream();
        stream.CopyTo(copy);
        return SKTypeface.FromData(SKData.CreateCopy(copy.ToArray()))
            ?? throw new InvalidOperationException($"the font {name} could not be read");
    }

    /// <summary>Answers every font request with the shipped regular or bold face.</summary>
    private sealed class EmbeddedFontResolver(SKTypeface regular, SKTypeface bold) : IFontResolver
    {
        public SKTypeface? CreateTypeface(string fontName, FontWeight weight, FontSlant slant, FontSpacing spacing) =>
            weight >= FontWeight.SemiBold ? bold : regular;

        public SKTypeface? CreateTypeface(string fontName, bool bold, bool italic) =>
            CreateTypeface(fontName, bold ? FontWeight.Bold : FontWeight.Normal, FontSlant.Upright, FontSpacing.Normal);
    }
}
