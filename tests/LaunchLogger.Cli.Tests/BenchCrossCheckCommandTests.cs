using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary><c>bench crosscheck</c> compares our figures with a simulated receiver's over several
/// drives and prints coverage per figure (its figures are for people; nothing here is timed).</summary>
public class BenchCrossCheckCommandTests
{
    [Fact]
    public void A_small_bench_compares_every_built_in_car_and_prints_coverage_per_figure()
    {
        var output = new StringWriter();
        ExitCode code = BenchCrossCheckCommand.Run(5, 2, output, new StringWriter());

        string text = output.ToString();
        Assert.DoesNotContain("not compared", text);
        Assert.Contains("clock offset: |error| p50", text);
        Assert.Matches(@"0-60 mph\s+standstill\s+\d+\s", text);
        Assert.Matches(@"0-60 mph\s+rollout\s+\d+\s", text);
        Assert.True(code is ExitCode.Ok or ExitCode.CheckFailed, text);
    }

    [Fact]
    public void No_drives_is_a_usage_error()
    {
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, BenchCrossCheckCommand.Run(0, 1, new StringWriter(), error));
        Assert.Contains("--runs must be", error.ToString());
    }
}
