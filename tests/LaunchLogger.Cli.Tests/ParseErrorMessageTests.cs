namespace LaunchLogger.Cli.Tests;

/// <summary>A mistyped option value, as a new user types it: each error is one line that names the
/// verb, the option, the value given and what it must be — no .NET type name, and not buried under
/// the verb's whole help text.</summary>
public class ParseErrorMessageTests
{
    public static TheoryData<string, string> MistypedValues => new()
    {
        { "report run.log --units furlongs", "launchlogger report: --units 'furlongs': give one of imperial, metric" },
        { "demo --seed 1.5", "launchlogger demo: --seed '1.5': give a whole number" },
        { "simulate --seed abc --out x.log", "launchlogger simulate: --seed 'abc': give a whole number" },
        { "report run.log --rollout-m abc", "launchlogger report: --rollout-m 'abc': give a number" },
        { "plot run.log --out x.svg --kind lunch", "launchlogger plot: --kind 'lunch': give one of trace, launch, overlay, braking" },
        { "board --units parsecs", "launchlogger board: --units 'parsecs': give one of imperial, metric" },
        { "calibrate", "launchlogger calibrate: give a command: distance, tyre-size" },
    };

    [Theory]
    [MemberData(nameof(MistypedValues))]
    public async Task A_mistyped_value_is_named_in_one_line_of_the_users_words(string commandLine, string expected)
    {
        var output = new StringWriter();
        var error = new StringWriter();

        int code = await LaunchLoggerCommand.InvokeAsync(commandLine.Split(' '), output, error);

        string errors = error.ToString();
        Assert.Equal((int)ExitCode.Usage, code);
        Assert.Contains(expected, errors);
        Assert.DoesNotContain("System.", errors);
        Assert.DoesNotContain("LaunchLogger.", errors);
        Assert.DoesNotContain("Usage:", errors);
        Assert.All(errors.Split('\n', StringSplitOptions.RemoveEmptyEntries), line => Assert.StartsWith("launchlogger", line));
        Assert.Equal("", output.ToString());
    }

    [Fact]
    public async Task Help_still_prints_the_whole_help()
    {
        var output = new StringWriter();
        int code = await LaunchLoggerCommand.InvokeAsync(["report", "--help"], output, new StringWriter());
        Assert.Equal((int)ExitCode.Ok, code);
        Assert.Contains("--units", output.ToString());
    }
}
