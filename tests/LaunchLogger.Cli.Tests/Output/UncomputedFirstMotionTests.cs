using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Tests.Shared;

namespace LaunchLogger.Cli.Tests.Output;

/// <summary>A first motion that could not be computed (not a number) is said in words on the
/// report table, never printed as "NaN".</summary>
public class UncomputedFirstMotionTests
{
    [Fact]
    public void The_table_says_not_found_for_a_first_motion_that_is_not_a_number()
    {
        RunReport run = UncomputedRun.FirstMotionNotANumber();
        using var output = new StringWriter();
        ReportTableWriter.Write(new ReportDocument { ToolVersion = "test", Source = "test", Runs = [run] }, output, DisplayUnits.Imperial);

        string line = output.ToString().Split('\n').Single(l => l.StartsWith("First motion", StringComparison.Ordinal));
        Assert.Contains("not found", line, StringComparison.Ordinal);
        Assert.DoesNotContain("NaN", output.ToString(), StringComparison.Ordinal);
    }
}
