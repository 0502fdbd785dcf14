using LaunchLogger.Cli.Bench;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary>A small seeded set of the robustness benchmark: every kind of damage at least twice,
/// through the reader and the whole report, with no crash, no hang and every undamaged frame back.</summary>
public class RobustnessBenchmarkTests
{
    [Fact]
    public void A_small_seeded_set_has_no_crash_no_hang_and_recovers_every_undamaged_frame()
    {
        var output = new StringWriter();
        int cases = 2 * Enum.GetValues<RobustnessBenchmark.Kind>().Length;

        ExitCode code = BenchRobustnessCommand.Run(cases, seed: 7, output, new StringWriter(), new RobustnessBenchmark.Limits(TimeSpan.FromMinutes(2), 512L * 1024 * 1024));

        string text = output.ToString();
        Assert.True(code == ExitCode.Ok, text);
        Assert.Contains("crashes                     0", text);
        Assert.Contains("hangs                       0", text);
        Assert.Contains("(100.000 %)", text);
    }
}
