using System.CommandLine;
using LaunchLogger.Archive.Records;

namespace LaunchLogger.Cli.Verbs;

/// <summary>The options that choose runs: <c>--event --car --driver --class --season</c>.</summary>
internal sealed class RunFilterOptions
{
    public Option<string?> Event { get; } = new("--event") { Description = "Only runs of this event." };

    public Option<string?> Car { get; } = new("--car") { Description = "Only runs of this car." };

    public Option<string?> Driver { get; } = new("--driver") { Description = "Only runs of this driver." };

    public Option<string?> Class { get; } = new("--class") { Description = "Only runs in this class." };

    public Option<int?> Season { get; } = new("--season") { Description = "Only runs at events in this year, e.g. 2026." };

    /// <summary>Adds the options to a command.</summary>
    public void AddTo(Command command)
    {
        foreach (Option option in new Option[] { Event, Car, Driver, Class, Season })
        {
            command.Options.Add(option);
        }
    }

    /// <summary>The filter given.</summary>
    public RunFilter Read(ParseResult parse) => new()
    {
        Event = parse.GetValue(Event),
        Car = parse.GetValue(Car),
        Driver = parse.GetValue(Driver),
        Class = parse.GetValue(Class),
        Season = parse.GetValue(Season),
    };
}
