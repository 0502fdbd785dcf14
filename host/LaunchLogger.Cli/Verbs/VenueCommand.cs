using System.CommandLine;
using LaunchLogger.Archive.Records;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger venue add|list|show|edit|export</c>: the archive's venue records.</summary>
public static class VenueCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create() => RecordVerbs.Create(RecordKind.Venue);
}
