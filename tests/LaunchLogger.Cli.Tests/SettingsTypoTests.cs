namespace LaunchLogger.Cli.Tests;

/// <summary>A settings file edited by hand, as a new user edits it: each slip is named in the
/// file's own words — the setting, what it must be, or where the JSON breaks — with exit 2, and
/// never a .NET type name the user cannot act on.</summary>
public class SettingsTypoTests
{
    [Theory]
    [InlineData("misspelt name", "{\"version\":1,\"circumferance_m\":1.83}", "unknown setting 'circumferance_m'; did you mean 'circumference_m'?")]
    [InlineData("number in quotes", "{\"version\":1,\"circumference_m\":\"1.83\"}", "'circumference_m' must be a number (without quotes")]
    [InlineData("trailing comma", "{\"version\":1,\"circumference_m\":1.83,}", "not valid JSON at line 1, column")]
    [InlineData("name nothing like a setting", "{\"version\":1,\"colour\":\"red\"}", "unknown setting 'colour' (known: ")]
    public async Task A_slip_in_the_settings_file_is_named_in_its_own_words(string name, string text, string expected)
    {
        _ = name;
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        File.WriteAllBytes(log, SimulatedLogs.Default.LogBytes);
        string settings = folder.Write("my-car.json", text);
        var output = new StringWriter();
        var error = new StringWriter();

        int code = await LaunchLoggerCommand.InvokeAsync(["report", log, "--settings", settings], output, error);

        string errors = error.ToString();
        Assert.Equal((int)ExitCode.BadInput, code);
        Assert.Contains(expected, errors);
        Assert.DoesNotContain(".NET", errors);
        Assert.DoesNotContain("System.", errors);
        Assert.DoesNotContain("LaunchLogger.", errors);
        Assert.Equal("", output.ToString());
    }
}
