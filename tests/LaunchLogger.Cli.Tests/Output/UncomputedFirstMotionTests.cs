using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Cli.Tests.Output;

/// <summary>A first motion that could not be computed (not a number) is said in words on the
/// report table, never printed as "NaN".</summary>
public class UncomputedFirstMotionTests
{
    [Fact]
    public void The_table_says_not_found_for_a_first_motion_that_is_not_a_number()
    {
        var figures = new FigureSet
        {
            FirstMotionS = new Estimate(double.NaN, double.NaN),
            RolloutDistanceM = 0.3048,
            SpeedIntervals = [],
            DistanceMarks = [],
            PeakAccelMps2 = 0,
            MaxSpeedMps = 0,
            DistanceM = 0,
        };
        RunReport run = RunReportBuilder.Build(1, "pulses and accelerometer", true, figures, null, []);
        using var output = new StringWriter();
        ReportTableWriter.Write(new ReportDocument { ToolVersion = "test", Source = "test", Runs = [run] }, output, DisplayUnits.Imperial);

        string line = output.ToString().Split('\n').Single(l => l.StartsWith("First motion", StringComparison.Ordinal));
        Assert.Contains("not found", line, StringComparison.Ordinal);
        Assert.DoesNotContain("NaN", output.ToString(), StringComparison.Ordinal);
    }
}
