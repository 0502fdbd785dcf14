using System.CommandLine;
using LaunchLogger.Archive.Records;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger driver add|list|show|edit|export</c>: the archive's driver records.</summary>
public static class DriverCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create() => RecordVerbs.Create(RecordKind.Driver);
}
