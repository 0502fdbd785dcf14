using System.CommandLine;
using LaunchLogger.Archive.Records;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger car add|list|show|edit|export</c>: the archive's car records.</summary>
public static class CarCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create() => RecordVerbs.Create(RecordKind.Car);
}
