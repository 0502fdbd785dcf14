namespace LaunchLogger.Archive;

/// <summary>The archive cannot do what was asked: a missing name, a file from a newer tool, a
/// value out of range. The message is one line for people.</summary>
public sealed class ArchiveException(string message, Exception? inner = null) : Exception(message, inner);
