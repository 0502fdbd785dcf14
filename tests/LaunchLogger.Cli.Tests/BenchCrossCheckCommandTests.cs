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
    public void A_small_bench_of_the_independent_generators_drives_compares_them_all()
    {
        var output = new StringWriter();
        ExitCode code = BenchCrossCheckCommand.Run(4, 3, output, new StringWriter(), generated: true);

        string text = output.ToString();
        Assert.Contains("4 drives of the independent generator", text);
        Assert.DoesNotContain("not compared", text);
        Assert.Contains("clock offset: |error| p50", text);
        Assert.Matches(@"0-60 mph\s+standstill\s+4\s", text);
        Assert.Matches(@"1320 ft \(1/4 mile\) trap\s+n/a\s+4\s", text);
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
