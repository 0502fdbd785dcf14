namespace LaunchLogger.Cli.Verbs;

/// <summary>What <c>launchlogger calibrate teeth</c> was asked, typed.</summary>
public sealed record CalibrateTeethRequest
{
    /// <summary>The log with the steady cruise.</summary>
    public required FileInfo Log { get; init; }

    /// <summary>Run number (from 1, in log order); null for the log's only run.</summary>
    public string? Run { get; init; }

    /// <summary>Settings file to create or update.</summary>
    public FileInfo? Settings { get; init; }

    /// <summary>True for JSON output.</summary>
    public bool Json { get; init; }
}
