using System.Text.Json;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Cli.Tests;

/// <summary>Exit codes as ExitCode.cs and the README document them — 0 all valid, 1 partial or
/// doubtful, 2 bad input, 3 usage — checked through the whole command line, verb by verb.</summary>
public class ExitCodeTests
{
    public static TheoryData<string> MistypedCommandLines => new()
    {
        "report run.log --no-such-option",
        "report run.log --rollout-m abc",
        "report run.log --weather",
        "report run.log --units furlongs",
        "simulate --seed twelve --out x.log",
        "simulate --out",
        "demo --seed 1.5",
        "demo --units parsecs",
        "selfcheck --what",
        "bench decode --no-such-option",
        "bench accuracy --runs many",
        "bench braking --seed x",
        "bench core --bogus",
        "bench crosscheck --runs x",
        "calibrate distance --metres",
        "calibrate mounting --bogus",
        "calibrate teeth --bogus",
        "safety --bogus",
        "no-such-verb",
    };

    [Theory]
    [MemberData(nameof(MistypedCommandLines))]
    public async Task A_command_line_that_does_not_parse_exits_with_the_usage_code(string commandLine)
    {
        var error = new StringWriter();
        int code = await LaunchLoggerCommand.InvokeAsync(commandLine.Split(' '), new StringWriter(), error);
        Assert.Equal((int)ExitCode.Usage, code);
        Assert.NotEqual("", error.ToString().Trim());
    }

    [Fact]
    public async Task Report_with_no_input_is_a_usage_error()
    {
        Assert.Equal((int)ExitCode.Usage, await Invoke("report"));
    }

    [Fact]
    public async Task Report_of_a_missing_file_is_bad_input()
    {
        using var folder = new TempFolder();
        Assert.Equal((int)ExitCode.BadInput, await Invoke("report", folder.File("missing.log")));
    }

    [Fact]
    public async Task Report_of_a_file_that_is_not_a_log_is_bad_input()
    {
        using var folder = new TempFolder();
        Assert.Equal((int)ExitCode.BadInput, await Invoke("report", folder.Write("notes.log", "shopping list\n")));
    }

    [Fact]
    public async Task Report_exits_0_only_when_every_run_is_valid_and_1_otherwise()
    {
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        File.WriteAllBytes(log, SimulatedLogs.Default.LogBytes);
        var output = new StringWriter();
        int code = await LaunchLoggerCommand.InvokeAsync(["report", log, "--json"], output, new StringWriter());

        using JsonDocument json = JsonDocument.Parse(output.ToString());
        bool allValid = json.RootElement.GetProperty("runs").EnumerateArray()
            .All(r => r.GetProperty("verdict").GetProperty("level").GetString() == "valid");
        Assert.Equal(allValid ? 0 : 1, code);
    }

    [Fact]
    public async Task Report_of_a_run_with_a_lost_frame_is_doubtful_and_exits_1()
    {
        // One pulse frame cut out of the middle of the run: the sequence gap makes it doubtful.
        using var folder = new TempFolder();
        string log = folder.File("gap.log");
        File.WriteAllBytes(log, WithoutFrame(SimulatedLogs.Default.LogBytes, FrameType.Pulses, 20));
        var output = new StringWriter();
        int code = await LaunchLoggerCommand.InvokeAsync(["report", log, "--json"], output, new StringWriter());

        using JsonDocument json = JsonDocument.Parse(output.ToString());
        string? level = json.RootElement.GetProperty("runs")[0].GetProperty("verdict").GetProperty("level").GetString();
        Assert.NotEqual("valid", level);
        Assert.Equal((int)ExitCode.Partial, code);
    }

    [Fact]
    public async Task Simulate_without_out_is_a_usage_error_and_an_unknown_scenario_bad_input()
    {
        using var folder = new TempFolder();
        Assert.Equal((int)ExitCode.Usage, await Invoke("simulate"));
        Assert.Equal((int)ExitCode.BadInput, await Invoke("simulate", "--scenario", "no-such-car", "--out", folder.File("x.log")));
        Assert.False(File.Exists(folder.File("x.log")));
    }

    [Fact]
    public async Task Simulate_that_succeeds_exits_0()
    {
        using var folder = new TempFolder();
        Assert.Equal((int)ExitCode.Ok, await Invoke("simulate", "--out", folder.File("x.log")));
        Assert.True(File.Exists(folder.File("x.log")));
    }

    [Fact]
    public async Task Demo_with_an_unknown_scenario_is_a_usage_error()
    {
        using var folder = new TempFolder();
        Assert.Equal((int)ExitCode.Usage, await Invoke("demo", "--scenario", "no-such-car", "--out", folder.Path));
    }

    [Fact]
    public async Task Calibrate_distance_of_a_missing_log_is_bad_input()
    {
        using var folder = new TempFolder();
        Assert.Equal((int)ExitCode.BadInput, await Invoke("calibrate", "distance", folder.File("missing.log"), "--metres", "100", "--settings", folder.File("car.json")));
        Assert.False(File.Exists(folder.File("car.json")));
    }

    [Fact]
    public async Task Safety_exits_0()
    {
        Assert.Equal((int)ExitCode.Ok, await Invoke("safety"));
    }

    private static Task<int> Invoke(params string[] args) => LaunchLoggerCommand.InvokeAsync(args, new StringWriter(), new StringWriter());

    /// <summary>The log with the <paramref name="nth"/> frame of <paramref name="type"/> cut out whole.</summary>
    internal static byte[] WithoutFrame(byte[] log, FrameType type, int nth)
    {
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        int offset = 0;
        int seen = 0;
        while (true)
        {
            var status = reader.TryReadFrame(log.AsSpan(offset), payload, true, out int used, out Frame frame);
            if (status == System.Buffers.OperationStatus.NeedMoreData)
            {
                throw new InvalidOperationException("the log has too few frames of that type");
            }

            if (status == System.Buffers.OperationStatus.Done && frame.Type == type && seen++ == nth)
            {
                return [.. log.AsSpan(0, offset), .. log.AsSpan(offset + used)];
            }

            offset += used;
        }
    }
}
