namespace LaunchLogger.Cli.Output;

/// <summary>Writes files so that a failure never leaves a half-written one behind: each goes to
/// a temporary file beside its target and is moved into place only when all are written.</summary>
public static class AtomicFile
{
    /// <summary>Writes every file, then moves them all into place; on any failure none of the
    /// targets is touched and the temporary files are removed.</summary>
    /// <exception cref="IOException">A file could not be written (the message names it).</exception>
    /// <exception cref="UnauthorizedAccessException">A folder cannot be written to.</exception>
    public static void WriteAll(IReadOnlyList<(string Path, Action<Stream> Write)> files)
    {
        var temps = new List<(string Temp, string Final)>(files.Count);
        try
        {
            foreach ((string path, Action<Stream> write) in files)
            {
                string full = Path.GetFullPath(path);
                Directory.CreateDirectory(Path.GetDirectoryName(full)!);
                string temp = $"{full}.{Environment.ProcessId}.part";
                temps.Add((temp, full));
                using var stream = new FileStream(temp, FileMode.Create, FileAccess.Write, FileShare.None);
                write(stream);
            }

            foreach ((string temp, string final) in temps)
            {
                File.Move(temp, final, overwrite: true);
            }
        }
        catch
        {
            foreach ((string temp, _) in temps)
            {
                TryDelete(temp);
            }

            throw;
        }
    }

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (IOException)
        {
        }
        catch (UnauthorizedAccessException)
        {
        }
    }
}
