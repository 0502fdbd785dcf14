using System.CommandLine;
using LaunchLogger.Archive.Records;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger class add|list|show|edit|export</c>: the archive's class records.</summary>
public static class ClassCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create() => RecordVerbs.Create(RecordKind.Class);
}
