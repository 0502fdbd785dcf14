using System.Globalization;
using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>The per-run error table that pools seeds.</summary>
public class ErrorTableTests
{
    [Fact]
    public void Each_reported_figure_is_a_row_with_its_error_sigma_and_their_ratio()
    {
        int n = BenchFigure.All.Count;
        var ours = new double?[n];
        var sigmas = new double?[n];
        var naive = new double?[n];
        ours[BenchFigure.FirstMotion] = 0.0012;
        sigmas[BenchFigure.FirstMotion] = 0.0004;
        naive[BenchFigure.FirstMotion] = 0.1;
        ours[BenchFigure.Trap] = -0.02;
        naive[BenchFigure.Rollout] = 0.005;
        var decoded = new CaseOutcome(7, "a run", BenchGroup.GeneratedLongIdle, ours, naive, sigmas, null);
        var failed = CaseOutcome.Failed(8, "another", BenchGroup.GeneratedLongIdle, "no run");
        var writer = new StringWriter();

        ErrorTable.Write([decoded, failed], writer);

        string[] lines = writer.ToString().TrimEnd().Split('\n').Select(l => l.TrimEnd('\r')).ToArray();
        Assert.Equal(ErrorTable.Header, lines[0]);
        Assert.Equal(3, lines.Length);
        string[] first = lines[1].Split(',');
        Assert.Equal(["7", "GeneratedLongIdle", "\"first motion\""], first[..3]);
        Assert.Equal(3.0, double.Parse(first[5], CultureInfo.InvariantCulture), 12);
        Assert.Equal(0.1, double.Parse(first[6], CultureInfo.InvariantCulture), 12);
        string[] trap = lines[2].Split(',');
        Assert.Equal(-0.02, double.Parse(trap[3], CultureInfo.InvariantCulture), 12);
        Assert.Equal("", trap[4]);
        Assert.Equal("", trap[5]);
    }
}
