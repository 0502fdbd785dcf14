using System.Text;
using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Pages.Tests;

/// <summary>A first motion that could not be computed (not a number) is said in words on the run
/// card, never printed as "NaN".</summary>
public class UncomputedFirstMotionTests
{
    [Fact]
    public void The_card_says_not_found_for_a_first_motion_that_is_not_a_number()
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
        var html = new StringBuilder();
        RunCard.Append(html, new CardInput { Run = run, ToolVersion = "test" });

        string page = html.ToString();
        Assert.Contains("not found", page, StringComparison.Ordinal);
        Assert.DoesNotContain("NaN", page, StringComparison.Ordinal);
    }
}
