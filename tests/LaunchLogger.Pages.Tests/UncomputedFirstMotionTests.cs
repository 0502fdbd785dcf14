using System.Text;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Tests.Shared;

namespace LaunchLogger.Pages.Tests;

/// <summary>A first motion that could not be computed (not a number) is said in words on the run
/// card, never printed as "NaN".</summary>
public class UncomputedFirstMotionTests
{
    [Fact]
    public void The_card_says_not_found_for_a_first_motion_that_is_not_a_number()
    {
        RunReport run = UncomputedRun.FirstMotionNotANumber();
        var html = new StringBuilder();
        RunCard.Append(html, new CardInput { Run = run, ToolVersion = "test" });

        string page = html.ToString();
        Assert.Contains("not found", page, StringComparison.Ordinal);
        Assert.DoesNotContain("NaN", page, StringComparison.Ordinal);
    }
}
