using System.Runtime.CompilerServices;
using ScottPlot;
using ScottPlot.Plottables;

namespace LaunchLogger.Plots;

/// <summary>Our look for every panel: paper ground, light grid, fixed margins so stacked panels
/// share one time axis, labels in the shipped font.</summary>
internal static class Panels
{
    private const float LeftPx = 78, RightPx = 24, BottomPx = 46, TopPx = 12, TitlePx = 40;

    /// <summary>A panel narrower or shorter than this (pixels) is drawn compact: smaller text and
    /// a legend in one column, so that nothing runs off it.</summary>
    private const int CompactWidthPx = 640, CompactHeightPx = 170;

    /// <summary>The panels drawn compact.</summary>
    private static readonly ConditionalWeakTable<Plot, object> CompactPanels = [];

    /// <summary>A new figure of the options' size whose panels are stacked in rows (or a grid of
    /// the given columns).</summary>
    public static Multiplot Figure(ChartOptions options, int panels, int columns = 1)
    {
        PlotFont.Register();
        int rows = (panels + columns - 1) / columns;
        bool compact = options.WidthPx / columns < CompactWidthPx || options.HeightPx / rows < CompactHeightPx;
        var figure = new Multiplot();
        figure.RemovePlot(figure.GetPlot(0));
        for (int i = 0; i < panels; i++)
        {
            figure.AddPlot(NewPanel(compact));
        }

        figure.Layout = columns == 1 ? new ScottPlot.MultiplotLayouts.Rows() : new ScottPlot.MultiplotLayouts.Grid(rows, columns);
        return figure;
    }

    private static Plot NewPanel(bool compact)
    {
        var plot = new Plot();
        if (compact)
        {
            CompactPanels.Add(plot, true);
        }

        plot.Font.Set(PlotFont.Family);
        plot.FigureBackground.Color = Palette.Paper;
        plot.DataBackground.Color = Palette.DataArea;
        plot.Axes.Color(Palette.Ink);
        plot.Grid.MajorLineColor = Palette.Grid;
        plot.Axes.Left.Label.FontSize = compact ? 11 : 13;
        plot.Axes.Bottom.Label.FontSize = compact ? 11 : 13;
        plot.Axes.Left.TickLabelStyle.FontSize = compact ? 10 : 12;
        plot.Axes.Bottom.TickLabelStyle.FontSize = compact ? 10 : 12;
        plot.Axes.Left.Label.Bold = false;
        plot.Axes.Bottom.Label.Bold = false;
        plot.Axes.Title.Label.FontSize = compact ? 12 : 15;
        plot.Layout.Fixed(new PixelPadding(LeftPx, RightPx, BottomPx, TopPx));
        return plot;
    }

    /// <summary>Gives a panel its heading (and room for it).</summary>
    public static void Title(Plot panel, string title)
    {
        panel.Title(title);
        panel.Layout.Fixed(new PixelPadding(LeftPx, RightPx, BottomPx, TitlePx));
    }

    /// <summary>Labels a panel's axes.</summary>
    public static void Label(Plot panel, string x, string y)
    {
        panel.XLabel(x);
        panel.YLabel(y);
    }

    /// <summary>A trace as a line, thinned to what <paramref name="widthPx"/> pixels can show.</summary>
    public static Scatter Line(Plot panel, double[] xs, double[] ys, Color colour, string legend, int widthPx, float width = 2)
    {
        int[] keep = Thinning.Keep(ys, widthPx);
        Scatter line = panel.Add.ScatterLine(Thinning.Pick(xs, keep), Thinning.Pick(ys, keep), colour);
        line.LineWidth = width;
        line.LegendText = legend;
        return line;
    }

    /// <summary>A ±σ band around a trace, thinned to what <paramref name="widthPx"/> pixels can show.</summary>
    public static FillY Band(Plot panel, double[] xs, double[] low, double[] high, Color trace, string legend, int widthPx)
    {
        int[] keep = Thinning.Keep(high, widthPx);
        FillY band = panel.Add.FillY(Thinning.Pick(xs, keep), Thinning.Pick(low, keep), Thinning.Pick(high, keep));
        band.FillColor = Palette.Band(trace);
        band.LineWidth = 0;
        band.LegendText = legend;
        return band;
    }

    /// <summary>A vertical mark at an instant, named in the legend when a name is given. Solid:
    /// SkiaSharp's SVG canvas cannot draw dashes, and SVG and PNG must show the same.</summary>
    public static VerticalLine Mark(Plot panel, double x, Color colour, string? name)
    {
        VerticalLine line = panel.Add.VerticalLine(x, 1.5f, colour);
        line.LegendText = name ?? "";
        return line;
    }

    /// <summary>A shaded stretch of time.</summary>
    public static HorizontalSpan Zone(Plot panel, double fromX, double toX, Color fill, string legend)
    {
        HorizontalSpan span = panel.Add.HorizontalSpan(fromX, toX, fill);
        span.LineWidth = 0;
        span.LegendText = legend;
        return span;
    }

    /// <summary>Shows the legend inside the panel: by default in one row along its top, above
    /// the traces (see <see cref="Headroom"/>).</summary>
    public static void Legend(Plot panel, Alignment where = Alignment.UpperCenter, Orientation orientation = Orientation.Horizontal)
    {
        bool compact = CompactPanels.TryGetValue(panel, out _);
        Legend legend = compact
            ? panel.ShowLegend(where is Alignment.LowerCenter or Alignment.LowerLeft or Alignment.LowerRight ? Alignment.LowerLeft : Alignment.UpperLeft, Orientation.Vertical)
            : panel.ShowLegend(where, orientation);
        legend.FontSize = compact ? 9 : 11;
        legend.BackgroundColor = Palette.Paper.WithAlpha(230);
        legend.OutlineColor = Palette.Grid;
        legend.FontColor = Palette.Ink;
        legend.ShadowOffset = new PixelOffset(0, 0);
        legend.ShadowColor = Colors.Transparent;
    }

    /// <summary>Hides the legends of every panel but the ones given.</summary>
    public static void LegendsOnlyOn(Multiplot figure, params Plot[] keep)
    {
        foreach (Plot panel in figure.GetPlots())
        {
            if (!keep.Contains(panel))
            {
                panel.HideLegend();
            }
        }
    }

    /// <summary>Sets a panel's vertical range to its data with room above for a one-row legend.</summary>
    public static void Headroom(Plot panel, IEnumerable<double> values)
    {
        double low = double.MaxValue, high = double.MinValue;
        foreach (double v in values)
        {
            if (double.IsFinite(v))
            {
                low = Math.Min(low, v);
                high = Math.Max(high, v);
            }
        }

        if (low > high)
        {
            return;
        }

        double span = Math.Max(high - low, 1e-9);
        panel.Axes.SetLimitsY(low - (0.05 * span), high + (0.28 * span));
    }

    /// <summary>Sets every panel's horizontal range.</summary>
    public static void SameX(Multiplot figure, double fromX, double toX)
    {
        foreach (Plot panel in figure.GetPlots())
        {
            panel.Axes.SetLimitsX(fromX, toX);
        }
    }
}
