using System.Globalization;
using System.Text.RegularExpressions;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
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

    [Fact]
    public void Some_logs_hold_bench_rests_whole_spoiled_and_cut_short_written_by_the_firmware_core()
    {
        IReadOnlyList<byte[]> bases = RobustnessBenchmark.BaseLogs(seed: 7);

        List<List<string>> outcomes = bases.Select(b => LogReader.Read(b, "base.log").BenchRests.Select(r => BenchRestReport.From(r).Outcome).ToList()).ToList();
        List<int> runs = bases.Select(b => LogReader.Read(b, "base.log").Runs.Count).ToList();

        Assert.Empty(outcomes[0]);
        Assert.Empty(outcomes[1]);
        Assert.Equal(["complete", "spoiled_by_pulse", "complete", "cut_short"], outcomes[2]);
        Assert.Equal(0, runs[2]);
        Assert.Equal(["complete", "cut_short"], outcomes[3]);
        Assert.True(runs[3] > 0);
    }

    [Fact]
    public void Damaged_logs_with_bench_rests_are_reported_without_a_crash_or_a_hang()
    {
        var output = new StringWriter();
        int cases = 4 * Enum.GetValues<RobustnessBenchmark.Kind>().Length;

        ExitCode code = BenchRobustnessCommand.Run(cases, seed: 3, output, new StringWriter(), new RobustnessBenchmark.Limits(TimeSpan.FromMinutes(2), 512L * 1024 * 1024));

        string text = output.ToString();
        Assert.True(code == ExitCode.Ok, text);
        Match line = Regex.Match(text, @"cases on logs with rests +(\d+); bench rests reported (\d+)");
        Assert.True(line.Success, text);
        Assert.True(int.Parse(line.Groups[1].Value, CultureInfo.InvariantCulture) >= cases / 4, text);
        Assert.True(int.Parse(line.Groups[2].Value, CultureInfo.InvariantCulture) > 0, text);
        Assert.Contains("crashes                     0", text);
        Assert.Contains("hangs                       0", text);
    }
}
