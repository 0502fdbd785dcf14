using LaunchLogger.Decoding.Analysis;
using SkiaSharp;

namespace LaunchLogger.Plots.Tests;

public sealed class RunChartsPngTests
{
    [Theory]
    [InlineData(960, 720)]
    [InlineData(400, 300)]
    [InlineData(1600, 900)]
    public void A_trace_png_has_the_asked_size_and_is_not_blank(int width, int height)
    {
        var png = new PngImage(RunCharts.Trace(SimulatedRuns.Launch, new ChartOptions { WidthPx = width, HeightPx = height }).ToPng());
        Assert.Equal(PngImage.Signature, png.Bytes[..8]);
        Assert.Equal(width, png.Width);
        Assert.Equal(height, png.Height);
        Assert.True(png.DistinctColours > 50, $"only {png.DistinctColours} colours");
        Assert.True(png.CountNear(ToSk(Palette.Speed)) > width / 4, "the speed trace is not drawn");
        Assert.True(png.CountNear(ToSk(Palette.Paper), 2) > width * height / 20, "no paper ground");
    }

    [Fact]
    public void Every_kind_of_chart_draws_a_png()
    {
        RunAnalysis[] runs = [SimulatedRuns.Launch, SimulatedRuns.Stop];
        Chart[] charts =
        [
            RunCharts.Overlay(runs, RunAlignment.Rollout),
            RunCharts.Braking(SimulatedRuns.Stop),
            RunCharts.CrossCheck(SimulatedRuns.Stop, SimulatedRuns.CrossCheckAt10Hz(SimulatedRuns.Stop)),
        ];
        foreach (Chart chart in charts)
        {
            using var stream = new MemoryStream();
            chart.Write(stream, ChartFormat.Png);
            var png = new PngImage(stream.ToArray());
            Assert.Equal((ChartOptions.DefaultWidthPx, ChartOptions.DefaultHeightPx), (png.Width, png.Height));
            Assert.True(png.DistinctColours > 50, $"only {png.DistinctColours} colours");
        }
    }

    [Fact]
    public void The_same_chart_gives_the_same_pixels()
    {
        byte[] a = RunCharts.Trace(SimulatedRuns.Stop).ToPng();
        byte[] b = RunCharts.Trace(SimulatedRuns.Stop).ToPng();
        Assert.Equal(new PngImage(a).Pixels, new PngImage(b).Pixels);
    }

    private static SKColor ToSk(ScottPlot.Color c) => new(c.R, c.G, c.B, c.A);
}
