using System.CommandLine;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli;

/// <summary>The whole command line: composes the verbs (each in Verbs/) and maps parse errors to
/// <see cref="ExitCode.Usage"/>, so a mistyped option never looks like a doubtful result.</summary>
public static class LaunchLoggerCommand
{
    /// <summary>Builds the root command with every verb.</summary>
    public static RootCommand Create() => new(
        "LaunchLogger: decode a launch logger's runs and report acceleration and braking figures " +
        "both from true standstill and after the 1-ft rollout, each with its uncertainty.")
    {
        SafetyCommand.Create(),
        DemoCommand.Create(),
        SelfCheckCommand.Create(),
        ReportCommand.Create(),
        BenchCommand.Create(),
        SimulateCommand.Create(),
        CalibrateCommand.Create(),
        CrossCheckCommand.Create(),
        PlotCommand.Create(),
        CaptureCommand.Create(),
        ImportCommand.Create(),
        BoardCommand.Create(),
        EventCommand.Create(),
        VenueCommand.Create(),
        CarCommand.Create(),
        DriverCommand.Create(),
        ClassCommand.Create(),
        RunCommand.Create(),
        ReanalyseCommand.Create(),
        CardCommand.Create(),
        ResultsCommand.Create(),
        ServeCommand.Create(),
    };

    /// <summary>Parses and runs <paramref name="args"/>; returns the process exit code.</summary>
    /// <remarks>System.CommandLine reports a parse error (unknown option, missing or unparsable
    /// value) with exit code 1 and the whole help text; here it becomes <see cref="ExitCode.Usage"/>
    /// (3), as ExitCode.cs and the README promise, and each error one line in the user's words
    /// (<see cref="ParseErrorMessages"/>); `launchlogger` alone still prints the whole help. When <paramref name="cancel"/> fires (Ctrl+C) and the verb does not
    /// finish cleanly, the code is <see cref="ExitCode.Cancelled"/> (130): a verb that gives up
    /// with OperationCanceledException would otherwise end with 1. The caller handles the
    /// signals (Program.cs); System.CommandLine's own handler, which is set up only after a
    /// synchronous verb has already done its work, is switched off.</remarks>
    public static async Task<int> InvokeAsync(string[] args, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        ParseResult parsed = Create().Parse(args);
        if (parsed.Errors.Count > 0 && args.Length > 0 && parsed.Action is not System.CommandLine.Help.HelpAction)
        {
            ParseErrorMessages.Write(parsed, error);
            return (int)ExitCode.Usage;
        }

        int code = await parsed.InvokeAsync(new InvocationConfiguration { Output = output, Error = error, ProcessTerminationTimeout = null }, cancel);
        if (parsed.Errors.Count > 0)
        {
            return (int)ExitCode.Usage;
        }

        return cancel.IsCancellationRequested && code != (int)ExitCode.Ok ? (int)ExitCode.Cancelled : code;
    }
}
