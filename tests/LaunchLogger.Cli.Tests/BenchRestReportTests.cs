using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Simulation.Box;

namespace LaunchLogger.Cli.Tests;

/// <summary>A bench rest is no run: report lists it plainly and reports the runs as without it.</summary>
public class BenchRestReportTests
{
    [Fact]
    public void A_log_of_rests_only_lists_them_as_bench_rests_and_reports_no_run()
    {
        using var folder = new TempFolder();
        string log = folder.File("bench.bin");
        File.WriteAllBytes(log, BenchRestLogs.Write(21, new BenchRestLogs.Rest(9.8), new BenchRestLogs.Rest(-9.8, PulseAtS: 3)));
        var text = new StringWriter();
        var json = new StringWriter();
        var error = new StringWriter();

        ExitCode textCode = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)] }, text, error);
        ExitCode jsonCode = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true }, json, error);

        Assert.True(textCode == ExitCode.Ok, error.ToString());
        Assert.Equal(ExitCode.Ok, jsonCode);
        Assert.Empty(error.ToString());
        Assert.Contains("Bench rests", text.ToString(), StringComparison.Ordinal);
        Assert.Contains("bench.bin rest 1: complete", text.ToString(), StringComparison.Ordinal);
        Assert.Contains("s, 20.0 s, 20000 samples, forward mean +9.800 m/s²", text.ToString(), StringComparison.Ordinal);
        Assert.Contains("bench.bin rest 2: spoiled: a wheel pulse came (the car moved), not usable", text.ToString(), StringComparison.Ordinal);
        Assert.DoesNotContain("#1: run", text.ToString(), StringComparison.Ordinal);
        using JsonDocument document = JsonDocument.Parse(json.ToString());
        Assert.Equal(0, document.RootElement.GetProperty("runs").GetArrayLength());
        JsonElement rests = document.RootElement.GetProperty("bench_rests");
        Assert.Equal(2, rests.GetArrayLength());
        Assert.Equal("complete", rests[0].GetProperty("outcome").GetString());
        Assert.Equal("spoiled_by_pulse", rests[1].GetProperty("outcome").GetString());
        Assert.InRange(rests[0].GetProperty("forward_mean_mps2").GetDouble(), 9.79, 9.81);
        Assert.InRange(rests[1].GetProperty("duration_s").GetDouble(), 3.0, 3.03);
    }

    [Fact]
    public void A_rest_after_a_run_leaves_the_runs_report_as_it_was()
    {
        using var folder = new TempFolder();
        Directory.CreateDirectory(folder.File("a"));
        Directory.CreateDirectory(folder.File("b"));
        string alone = Path.Combine(folder.File("a"), "box.log");
        string joined = Path.Combine(folder.File("b"), "box.log");
        File.WriteAllBytes(alone, SimulatedLogs.Default.LogBytes);
        File.WriteAllBytes(joined, [.. SimulatedLogs.Default.LogBytes, .. BenchRestLogs.Write(22, new BenchRestLogs.Rest(9.8))]);
        var before = new StringWriter();
        var after = new StringWriter();

        ExitCode codeBefore = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(alone)], Json = true }, before, new StringWriter());
        ExitCode codeAfter = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(joined)], Json = true }, after, new StringWriter());

        Assert.Equal(codeBefore, codeAfter);
        using JsonDocument a = JsonDocument.Parse(before.ToString());
        using JsonDocument b = JsonDocument.Parse(after.ToString());
        Assert.Equal(a.RootElement.GetProperty("runs").GetRawText(), b.RootElement.GetProperty("runs").GetRawText());
        Assert.Equal(1, b.RootElement.GetProperty("bench_rests").GetArrayLength());
        Assert.Equal(0, a.RootElement.GetProperty("bench_rests").GetArrayLength());
    }
}
