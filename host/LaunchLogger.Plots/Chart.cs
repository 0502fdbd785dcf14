using System.Text;
using ScottPlot;
using SkiaSharp;

namespace LaunchLogger.Plots;

/// <summary>A drawn chart: one or more panels stacked or in a grid, ready to write as SVG or PNG.</summary>
public sealed class Chart
{
    private readonly Multiplot figure;

    internal Chart(Multiplot figure, ChartOptions options)
    {
        this.figure = figure;
        Options = options;
    }

    /// <summary>The options it was drawn with.</summary>
    public ChartOptions Options { get; }

    /// <summary>The chart as a self-contained SVG document (text as &lt;text&gt; in DejaVu Sans,
    /// no external references), sized <see cref="ChartOptions.WidthPx"/> ×
    /// <see cref="ChartOptions.HeightPx"/>. Fit to inline in HTML.</summary>
    public string ToSvg()
    {
        int w = Options.WidthPx, h = Options.HeightPx;

        // Lay out once on a raster (as ScottPlot does for its own SVG output), then draw to SVG.
        using (figure.Render(w, h))
        {
        }

        using var stream = new MemoryStream();
        using (SKCanvas canvas = SKSvgCanvas.Create(new SKRect(0, 0, w, h), stream))
        {
            figure.Render(canvas, new PixelRect(0, w, h, 0));
        }

        return Encoding.UTF8.GetString(stream.ToArray());
    }

    /// <summary>The chart as PNG bytes, <see cref="ChartOptions.WidthPx"/> ×
    /// <see cref="ChartOptions.HeightPx"/> pixels.</summary>
    public byte[] ToPng()
    {
        using Image image = figure.Render(Options.WidthPx, Options.HeightPx);
        return image.GetImageBytes(ImageFormat.Png);
    }

    /// <summary>Writes the chart to a stream in the given format.</summary>
    public void Write(Stream stream, ChartFormat format)
    {
        byte[] bytes = format == ChartFormat.Svg ? Encoding.UTF8.GetBytes(ToSvg()) : ToPng();
        stream.Write(bytes);
    }
}
