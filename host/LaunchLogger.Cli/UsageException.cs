namespace LaunchLogger.Cli;

/// <summary>The command line asks for something that cannot be done; the message says what, in one line.</summary>
public sealed class UsageException(string message) : Exception(message);
