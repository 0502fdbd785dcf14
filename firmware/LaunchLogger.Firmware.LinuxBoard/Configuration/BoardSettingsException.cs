namespace LaunchLogger.Firmware.LinuxBoard.Configuration;

/// <summary>The settings file cannot be used; the message says which key and why.</summary>
public sealed class BoardSettingsException : Exception
{
    /// <summary>Creates the exception with a message for the person running the box.</summary>
    public BoardSettingsException(string message)
        : base(message)
    {
    }
}
