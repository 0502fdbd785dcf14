namespace LaunchLogger.Plots.Tests;

public sealed class PlotFontTests
{
    [Fact]
    public void Every_font_request_gets_the_shipped_dejavu_sans()
    {
        PlotFont.Register();
        Assert.Single(ScottPlot.Fonts.FontResolvers);
        Assert.Equal("DejaVu Sans", ScottPlot.Fonts.GetTypeface("Some Font Nobody Has", bold: false, italic: false).FamilyName);
        Assert.Equal("DejaVu Sans", ScottPlot.Fonts.GetTypeface("Arial", bold: true, italic: false).FamilyName);
        Assert.True(ScottPlot.Fonts.GetTypeface("x", bold: true, italic: false).IsBold);
        Assert.Equal("DejaVu Sans", ScottPlot.Fonts.Default);
    }
}
