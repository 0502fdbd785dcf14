namespace LaunchLogger.Archive;

/// <summary>Where the archive lives when no <c>--archive FILE</c> is given.</summary>
/// <remarks>In order: the <c>LAUNCHLOGGER_ARCHIVE</c> environment variable; otherwise
/// <c>launchlogger/archive.db</c> under the user's local application-data folder
/// (<c>$XDG_DATA_HOME</c> or <c>~/.local/share</c> on Linux, <c>%LOCALAPPDATA%</c> on Windows,
/// <c>~/Library/Application Support</c> on macOS). The file is created on first use.</remarks>
public static class ArchiveLocation
{
    /// <summary>The environment variable that overrides the default.</summary>
    public const string EnvironmentVariable = "LAUNCHLOGGER_ARCHIVE";

    /// <summary>The default archive file.</summary>
    public static string Default
    {
        get
        {
            string? fromEnvironment = Environment.GetEnvironmentVariable(EnvironmentVariable);
            if (!string.IsNullOrWhiteSpace(fromEnvironment))
            {
                return Path.GetFullPath(fromEnvironment);
            }

            string data = Environment.GetFolderPath(Environment.SpecialFolder.LocalApplicationData, Environment.SpecialFolderOption.DoNotVerify);
            if (string.IsNullOrEmpty(data))
            {
                data = Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".local", "share");
            }

            return Path.Combine(data, "launchlogger", "archive.db");
        }
    }
}
