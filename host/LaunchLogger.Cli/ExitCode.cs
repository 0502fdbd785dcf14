namespace LaunchLogger.Cli;

/// <summary>Every exit code the command returns.</summary>
public enum ExitCode
{
    /// <summary>Done; every figure asked for was produced.</summary>
    Ok = 0,

    /// <summary>Done, but with results that are partial or marked doubtful.</summary>
    Partial = 1,

    /// <summary>The input was unusable (missing file, bad header, no motion…); nothing written.</summary>
    BadInput = 2,

    /// <summary>The command line was wrong.</summary>
    Usage = 3,

    /// <summary>A self-check or benchmark found the product not working as it should.</summary>
    CheckFailed = 4,

    /// <summary>Stopped by the user (Ctrl+C).</summary>
    Cancelled = 130,
}
