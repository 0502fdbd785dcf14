using System.Text.Json;
using System.Text.RegularExpressions;
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

    [Fact]
    public void Report_json_md_lists_every_key_the_report_writes_for_a_bench_rest_and_at_the_top()
    {
        using var folder = new TempFolder();
        string log = folder.File("bench.bin");
        File.WriteAllBytes(log, [
            .. SimulatedLogs.Default.LogBytes,
            .. BenchRestLogs.Write(23, 4_000_000, new BenchRestLogs.Rest(9.8), new BenchRestLogs.Rest(-9.8, PulseAtS: 1), new BenchRestLogs.Rest(-9.8, ShutdownAtS: 2)),
        ]);
        var json = new StringWriter();

        ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true }, json, new StringWriter());

        using JsonDocument document = JsonDocument.Parse(json.ToString());
        JsonElement rests = document.RootElement.GetProperty("bench_rests");
        Assert.Equal(["complete", "spoiled_by_pulse", "cut_short"], rests.EnumerateArray().Select(r => r.GetProperty("outcome").GetString()));
        Assert.Equal([4.0, 4.0, 4.0], rests.EnumerateArray().Select(r => r.GetProperty("length_s").GetDouble()));
        Assert.InRange(rests[2].GetProperty("duration_s").GetDouble(), 2.0, 2.03);
        Assert.All(rests.EnumerateArray(), r => Assert.Equal(0, r.GetProperty("frames_lost").GetInt64()));
        Assert.All(rests.EnumerateArray(), r => Assert.Equal(0, r.GetProperty("samples_lost").GetInt64()));

        string block = ReportJsonExample();
        int restsAt = block.IndexOf("\"bench_rests\": [", StringComparison.Ordinal);
        Assert.True(restsAt > 0, "REPORT-JSON.md has no bench_rests entry");
        string restBlock = block[restsAt..block.IndexOf("\n  ]", restsAt, StringComparison.Ordinal)];
        var documented = Regex.Matches(restBlock, "\"([a-z0-9_]+)\":").Select(m => m.Groups[1].Value).Where(k => k != "bench_rests").ToHashSet();
        var written = rests[0].EnumerateObject().Select(p => p.Name).ToHashSet();
        Assert.Equal(written.Order(), documented.Order());

        // The top-level keys (two spaces in) are all documented, and nothing documented is gone.
        var topDocumented = Regex.Matches(block, "^  \"([a-z0-9_]+)\":", RegexOptions.Multiline).Select(m => m.Groups[1].Value).ToHashSet();
        var topWritten = document.RootElement.EnumerateObject().Select(p => p.Name).ToHashSet();
        Assert.Equal(topWritten.Order(), topDocumented.Order());
    }

    /// <summary>The example document in host/LaunchLogger.Decoding/Reporting/REPORT-JSON.md.</summary>
    private static string ReportJsonExample()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir != null && !File.Exists(Path.Combine(dir.FullName, "LaunchLogger.sln")))
        {
            dir = dir.Parent;
        }

        Assert.NotNull(dir);
        string text = File.ReadAllText(Path.Combine(dir.FullName, "host", "LaunchLogger.Decoding", "Reporting", "REPORT-JSON.md"));
        int start = text.IndexOf("```jsonc", StringComparison.Ordinal);
        int end = text.IndexOf("```", start + 8, StringComparison.Ordinal);
        return text[start..end];
    }
}
