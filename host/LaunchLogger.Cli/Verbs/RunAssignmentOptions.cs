using System.CommandLine;
using LaunchLogger.Archive.Importing;

namespace LaunchLogger.Cli.Verbs;

/// <summary>The <c>--event --car --driver --class</c> options that say where runs belong.</summary>
internal sealed class RunAssignmentOptions
{
    public Option<string?> Event { get; } = new("--event") { Description = "The event the runs belong to." };

    public Option<string?> Car { get; } = new("--car") { Description = "The car (its settings and calibration are applied)." };

    public Option<string?> Driver { get; } = new("--driver") { Description = "The driver." };

    public Option<string?> Class { get; } = new("--class") { Description = "The class (default: the car's)." };

    /// <summary>Adds the options to a command.</summary>
    public void AddTo(Command command)
    {
        command.Options.Add(Event);
        command.Options.Add(Car);
        command.Options.Add(Driver);
        command.Options.Add(Class);
    }

    /// <summary>The assignment given.</summary>
    public RunAssignment Read(ParseResult parse) => new()
    {
        Event = parse.GetValue(Event),
        Car = parse.GetValue(Car),
        Driver = parse.GetValue(Driver),
        Class = parse.GetValue(Class),
    };
}
