using System.Xml.Linq;

namespace LaunchLogger.Plots.Tests;

public class RunChartsTests
{
    [Fact]
    public void TraceSvgIsAnSvgDocument()
    {
        XDocument svg = XDocument.Parse(RunCharts.TraceSvg(SimulatedRuns.Launch));
        Assert.Equal("svg", svg.Root!.Name.LocalName);
    }
}
