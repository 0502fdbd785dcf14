using System.Globalization;
using System.IO.Hashing;
using System.Text;
using System.Text.RegularExpressions;
using ScottPlot;
using SkiaSharp;

namespace LaunchLogger.Plots;

/// <summary>A drawn chart: one or more panels stacked or in a grid, ready to write as SVG or PNG.</summary>
public sealed partial class Chart
{
    private readonly Multiplot figure;

    internal Chart(Multiplot figure, ChartOptions options)
    {
        this.figure = figure;
        Options = options;
    }

    /// <summary>The options it was drawn with.</summary>
    public ChartOptions Options { get; }

    /// <summary>The chart as a self-contained SVG document: an XML declaration, then one
    /// &lt;svg&gt; element sized <see cref="ChartOptions.WidthPx"/> × <see cref="ChartOptions.HeightPx"/>
    /// with a matching viewBox. Text is &lt;text font-family="DejaVu Sans"&gt;; nothing outside
    /// the document is referenced.</summary>
    public string ToSvg() => "<?xml version=\"1.0\" encoding=\"utf-8\" ?>\n" + ToInlineSvg();

    /// <summary>The chart's &lt;svg&gt; element alone, to put inside an HTML page. Its internal
    /// ids (clip paths) carry a prefix taken from the drawing itself, so two different charts
    /// on one page never share an id.</summary>
    public string ToInlineSvg()
    {
        int w = Options.WidthPx, h = Options.HeightPx;
        PixelRect[] rects = Layout(w, h);
        using var stream = new MemoryStream();
        using (SKCanvas canvas = SKSvgCanvas.Create(new SKRect(0, 0, w, h), stream))
        {
            Draw(canvas, rects);
        }

        string svg = Encoding.UTF8.GetString(stream.ToArray());
        svg = svg[svg.IndexOf("<svg", StringComparison.Ordinal)..].TrimEnd();

        // Skia numbers clip paths from a process-wide counter: renumber them in document order,
        // so one chart always gives the same text, then prefix them with a hash of the drawing
        // so that two different charts on one page never share an id.
        var numbers = new Dictionary<string, int>(StringComparer.Ordinal);
        svg = ClipId().Replace(svg, m =>
        {
            if (!numbers.TryGetValue(m.Groups[2].Value, out int n))
            {
                n = numbers.Count + 1;
                numbers[m.Groups[2].Value] = n;
            }

            return m.Groups[1].Value + "clip" + n.ToString(CultureInfo.InvariantCulture);
        });
        string prefix = "ll" + Convert.ToHexStringLower(XxHash32.Hash(Encoding.UTF8.GetBytes(svg)));
        svg = OurClipId().Replace(svg, m => m.Groups[1].Value + prefix + "_" + m.Groups[2].Value);

        // Skia writes glyph positions as "0, 9.2, " (a trailing comma browsers report as an
        // error) and indents text content; keep plain number lists and the text alone.
        svg = PositionList().Replace(svg, m => " " + m.Groups[1].Value + "=\"" + string.Join(' ', m.Groups[2].Value.Split([',', ' '], StringSplitOptions.RemoveEmptyEntries)) + "\"");
        svg = TextContent().Replace(svg, m => ">" + m.Groups[1].Value + "</text>");
        string size = string.Create(CultureInfo.InvariantCulture, $"width=\"{w}\" height=\"{h}\"");
        return svg.Replace("<svg ", "<svg viewBox=\"0 0 " + w.ToString(CultureInfo.InvariantCulture) + " " + h.ToString(CultureInfo.InvariantCulture) + "\" ", StringComparison.Ordinal)
            .Replace(size + ">", size + " role=\"img\">", StringComparison.Ordinal);
    }

    /// <summary>The chart as PNG bytes, <see cref="ChartOptions.WidthPx"/> ×
    /// <see cref="ChartOptions.HeightPx"/> pixels.</summary>
    public byte[] ToPng()
    {
        int w = Options.WidthPx, h = Options.HeightPx;
        PixelRect[] rects = Layout(w, h);
        using SKSurface surface = SKSurface.Create(new SKImageInfo(w, h, SKColorType.Rgba8888, SKAlphaType.Premul));
        surface.Canvas.Clear(Palette.Paper.ToSKColor());
        Draw(surface.Canvas, rects);
        using SKImage image = surface.Snapshot();
        using SKData png = image.Encode(SKEncodedImageFormat.Png, 100);
        return png.ToArray();
    }

    /// <summary>Writes the chart to a stream in the given format.</summary>
    public void Write(Stream stream, ChartFormat format)
    {
        byte[] bytes = format == ChartFormat.Svg ? Encoding.UTF8.GetBytes(ToSvg()) : ToPng();
        stream.Write(bytes);
    }

    /// <summary>Each panel's rectangle, after laying the panels out once on a scratch raster (as
    /// ScottPlot does before its own SVG output: axis limits and ticks settle on a first render).</summary>
    private PixelRect[] Layout(int w, int h)
    {
        var whole = new PixelRect(0, w, h, 0);
        PixelRect[] rects = figure.Layout.GetSubplotRectangles(figure.Subplots, whole);
        using SKSurface scratch = SKSurface.Create(new SKImageInfo(w, h));
        Draw(scratch.Canvas, rects);
        return rects;
    }

    private void Draw(SKCanvas canvas, PixelRect[] rects)
    {
        Plot[] panels = figure.GetPlots();
        for (int i = 0; i < panels.Length; i++)
        {
            panels[i].RenderManager.ClearCanvasBeforeEachRender = false;
            panels[i].Render(canvas, rects[i]);
        }
    }

    [GeneratedRegex("(id=\"|url\\(#)(cl_[0-9a-fA-F]+)")]
    private static partial Regex ClipId();

    [GeneratedRegex("(id=\"|url\\(#)(clip[0-9]+)")]
    private static partial Regex OurClipId();

    [GeneratedRegex(" (x|y)=\"([-0-9., ]*)\"")]
    private static partial Regex PositionList();

    [GeneratedRegex(">\\s+([^<]*?)\\s+</text>")]
    private static partial Regex TextContent();
}
