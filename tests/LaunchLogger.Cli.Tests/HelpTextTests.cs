using System.CommandLine;

namespace LaunchLogger.Cli.Tests;

/// <summary>The help of every command, walked the way a first-time user reads it.</summary>
public sealed class HelpTextTests
{
    private static IEnumerable<(string Path, Option Option)> AllOptions()
    {
        var stack = new Stack<(string, Command)>([("launchlogger", LaunchLoggerCommand.Create())]);
        while (stack.Count > 0)
        {
            (string path, Command command) = stack.Pop();
            foreach (Option option in command.Options)
            {
                yield return (path, option);
            }

            foreach (Command sub in command.Subcommands)
            {
                stack.Push(($"{path} {sub.Name}", sub));
            }
        }
    }

    /// <summary>Help already marks a required option "(REQUIRED)"; before, crosscheck's --with
    /// said it twice ("(REQUIRED) The other instrument's record (required).").</summary>
    [Fact]
    public void No_required_option_says_so_again_in_its_description()
    {
        string[] twice = AllOptions()
            .Where(o => o.Option.Required && (o.Option.Description ?? "").Contains("required", StringComparison.OrdinalIgnoreCase))
            .Select(o => $"{o.Path} {o.Option.Name}")
            .ToArray();

        Assert.Empty(twice);
    }

    /// <summary>Every --units names the units each choice gives, as report's does. Before, demo's
    /// and capture's said only "imperial or metric".</summary>
    [Fact]
    public void Every_units_option_names_its_units()
    {
        var units = AllOptions().Where(o => o.Option.Name == "--units").ToList();

        Assert.True(units.Count >= 9, $"found {units.Count} --units options");
        Assert.All(units, o => Assert.Matches(@"imperial \(mph[^)]*\) or metric \(km/h[^)]*\)", o.Option.Description));
    }
}
