using System.CommandLine;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger safety</c>: prints the safety cautions.</summary>
public static class SafetyCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var command = new Command("safety", "Print the safety cautions for using the box in a car.");
        command.SetAction(parse =>
        {
            parse.InvocationConfiguration.Output.Write(SafetyNotice.Text);
            return (int)ExitCode.Ok;
        });
        return command;
    }
}
