using System.CommandLine;
using LaunchLogger.Archive.Records;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger event add|list|show|edit|export</c>: the archive's event records.</summary>
public static class EventCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create() => RecordVerbs.Create(RecordKind.Event);
}
