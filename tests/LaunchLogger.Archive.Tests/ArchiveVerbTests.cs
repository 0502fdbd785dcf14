using LaunchLogger.Archive.Tests.Support;
using LaunchLogger.Cli;

namespace LaunchLogger.Archive.Tests;

/// <summary>The archive verbs through the whole command line: help, exit codes, one-line errors, JSON.</summary>
public class ArchiveVerbTests
{
    public static TheoryData<string> Verbs => new()
    {
        "capture", "import", "board", "reanalyse", "run list", "run show", "run edit", "run export",
        "event add", "event list", "event show", "event edit", "event export",
        "venue add", "car add", "car edit", "driver add", "class add", "bench archive",
    };

    public static TheoryData<string> Mistyped => new()
    {
        "board --figure",
        "board --no-such-option",
        "import",
        "capture --baud fast",
        "run show abc",
        "run edit",
        "event add",
        "car add x --pulses-per-rev many",
        "bench archive --runs lots",
    };

    [Theory]
    [MemberData(nameof(Verbs))]
    public async Task Every_verb_has_help(string verb)
    {
        var output = new StringWriter();
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync([.. verb.Split(' '), "--help"], output, new StringWriter()));
        Assert.Contains("--", output.ToString());
    }

    [Theory]
    [MemberData(nameof(Mistyped))]
    public async Task A_wrong_command_line_is_a_usage_error(string commandLine)
    {
        var error = new StringWriter();
        Assert.Equal((int)ExitCode.Usage, await LaunchLoggerCommand.InvokeAsync(commandLine.Split(' '), new StringWriter(), error));
        Assert.NotEqual("", error.ToString().Trim());
    }

    [Fact]
    public async Task Unknown_names_and_bad_values_are_one_line_errors_with_their_codes()
    {
        using var temp = new TempFolder();
        string a = temp.File("a.db");
        async Task<(int Code, string Error)> Run(params string[] args)
        {
            var error = new StringWriter();
            int code = await LaunchLoggerCommand.InvokeAsync([.. args, "--archive", a], new StringWriter(), error);
            return (code, error.ToString().Trim());
        }

        Assert.Equal(((int)ExitCode.BadInput, "launchlogger board: no event named 'Nope' (add it with `event add`)"), await Run("board", "--event", "Nope"));
        Assert.Equal(((int)ExitCode.Usage, "launchlogger board: --figure 0-70mph: give one of 0-60mph, 0-100kmh, 60ft, 330ft, eighth, quarter, eighth-trap, trap, stop, stop-60"), await Run("board", "--figure", "0-70mph"));
        Assert.Equal(((int)ExitCode.BadInput, "launchlogger run show: no run 5"), await Run("run", "show", "5"));
        Assert.Equal(((int)ExitCode.BadInput, "launchlogger event add: 'April 12' is not a date as yyyy-MM-dd"), await Run("event", "add", "Spring", "--date", "April 12"));
        (int code, string error) = await Run("event", "add", "Spring", "--date", "2026-04-12");
        Assert.Equal(((int)ExitCode.Ok, ""), (code, error));
        Assert.Equal((int)ExitCode.BadInput, (await Run("event", "add", "spring", "--date", "2026-04-12")).Code);
        Assert.Equal(((int)ExitCode.BadInput, "launchlogger event add: an event named 'Spring' exists already; change it with `event edit`"), await Run("event", "add", "Spring", "--date", "2026-04-12"));
        Assert.Equal(((int)ExitCode.BadInput, "launchlogger event add: an event needs --date"), await Run("event", "add", "Summer"));
        Assert.Equal((int)ExitCode.Ok, (await Run("car", "add", "Blue")).Code);
        Assert.Equal(((int)ExitCode.BadInput, "launchlogger car add: a car named 'Blue' exists already; change it with `car edit`"), await Run("car", "add", "Blue"));
        var help = new StringWriter();
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["event", "--help"], help, new StringWriter()));
        Assert.Contains("Add an event.", help.ToString());
        Assert.Contains("Change an event's fields", help.ToString());
    }

    [Fact]
    public async Task Listings_and_exports_carry_the_same_rows_as_json_and_csv()
    {
        using var temp = new TempFolder();
        string a = temp.File("a.db");
        foreach (string name in new[] { "Robin Vale", "Sam \"Sparks\" Ito, jr" })
        {
            Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["driver", "add", name, "--club", "Fenside MC", "--archive", a], new StringWriter(), new StringWriter()));
        }

        var json = new StringWriter();
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["driver", "list", "--json", "--archive", a], json, new StringWriter()));
        using var document = System.Text.Json.JsonDocument.Parse(json.ToString());
        Assert.Equal(["Robin Vale", "Sam \"Sparks\" Ito, jr"], document.RootElement.EnumerateArray().Select(e => e.GetProperty("name").GetString()));

        string csvPath = temp.File("drivers.csv");
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["driver", "export", "--format", "csv", "--out", csvPath, "--archive", a], new StringWriter(), new StringWriter()));
        string[] lines = File.ReadAllLines(csvPath);
        Assert.Equal("id,name,club,notes,runs", lines[0]);

        // RFC 4180 §2: a field with a comma or a quote is quoted, its quotes doubled.
        Assert.Equal("2,\"Sam \"\"Sparks\"\" Ito, jr\",Fenside MC,,0", lines[2]);
    }
}
