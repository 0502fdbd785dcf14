namespace LaunchLogger.Plots.Tests;

public sealed class ChartFormatTests
{
    [Theory]
    [InlineData("run.svg", ChartFormat.Svg)]
    [InlineData("RUN.SVG", ChartFormat.Svg)]
    [InlineData("out/run.png", ChartFormat.Png)]
    [InlineData("a.b.Png", ChartFormat.Png)]
    public void The_extension_picks_the_format(string path, ChartFormat expected) =>
        Assert.Equal(expected, ChartFormats.FromPath(path));

    [Theory]
    [InlineData("run.jpg")]
    [InlineData("run")]
    [InlineData("run.svg.txt")]
    public void Other_extensions_pick_none(string path) => Assert.Null(ChartFormats.FromPath(path));
}
