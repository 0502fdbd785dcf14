namespace LaunchLogger.Decoding.Import;

/// <summary>Opens input files, turning the usual failures into one-line <see cref="InputException"/>s.</summary>
internal static class InputFiles
{
    /// <exception cref="InputException">Missing, a directory, or unreadable.</exception>
    public static FileStream Open(string path)
    {
        if (Directory.Exists(path))
        {
            throw new InputException(path, 0, "is a directory, not a file");
        }

        if (!File.Exists(path))
        {
            throw new InputException(path, 0, "file not found");
        }

        try
        {
            return new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 64 * 1024);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, 0, "cannot be opened: " + e.Message, e);
        }
    }

    /// <summary>Opens a text file for reading (UTF-8; a byte order mark is honoured).</summary>
    public static StreamReader OpenText(string path) => new(Open(path));
}
