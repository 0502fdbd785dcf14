using System.CommandLine;
using LaunchLogger.Cli;
using LaunchLogger.Cli.Verbs;

// Composes the verbs; each lives in Verbs/ with its own factory and handler.
SafetyNotice.ShowOnFirstRun(Console.Error);
var root = new RootCommand(
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
};
return await root.Parse(args).InvokeAsync(new InvocationConfiguration { Output = Console.Out, Error = Console.Error });
