namespace LaunchLogger.Cli.Verbs;

/// <summary>What <c>launchlogger calibrate mounting</c> was asked, typed.</summary>
public sealed record CalibrateMountingRequest
{
    /// <summary>One log (a rest on level ground, or with two <see cref="Runs"/> the two opposite
    /// rests), or two logs of opposite rests on one spot.</summary>
    public required IReadOnlyList<FileInfo> Logs { get; init; }

    /// <summary>Run numbers (from 1, in log order): none, one, or two (one per rest).</summary>
    public IReadOnlyList<string> Runs { get; init; } = [];

    /// <summary>Settings file to create or update.</summary>
    public FileInfo? Settings { get; init; }

    /// <summary>True for JSON output.</summary>
    public bool Json { get; init; }
}
