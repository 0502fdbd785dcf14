using System.Collections.Concurrent;

namespace LaunchLogger.Cli.Output;

/// <summary>Writes a set of files all or none: a failure or Ctrl+C never leaves a half-written
/// file, nor some of the set written and the rest not.</summary>
/// <remarks>
/// <para>Each file is written to a temporary file of its own beside its target (a distinct name
/// per file and process, so two targets never share one). Only when every one is written are they
/// moved into place; a target that existed is first moved aside, and put back if a later move
/// fails. Targets are checked first: two of them naming one file, or a target that is a folder,
/// fail before anything is written.</para>
/// <para>Temporary files still present when the process ends (Ctrl+C while writing) are removed
/// by a process-exit handler.</para>
/// </remarks>
public static class AtomicFile
{
    // Temporary files of writes under way; for a target moved aside, the target to put it back to.
    private static readonly ConcurrentDictionary<string, string?> Pending = new();

    static AtomicFile()
    {
        AppDomain.CurrentDomain.ProcessExit += (_, _) => RemovePending();
    }

    /// <summary>Writes every file, then moves them all into place; on any failure or cancellation
    /// no target is changed and no temporary file is left.</summary>
    /// <exception cref="IOException">A file could not be written or moved, two targets name the
    /// same file, or a target is a folder (the message names it).</exception>
    /// <exception cref="UnauthorizedAccessException">A folder cannot be written to.</exception>
    /// <exception cref="OperationCanceledException">Cancelled before the files were moved.</exception>
    public static void WriteAll(IReadOnlyList<(string Path, Action<Stream> Write)> files, CancellationToken cancel = default)
    {
        List<string> targets = CheckTargets(files.Select(f => f.Path));
        string tag = $"{Environment.ProcessId}.{Guid.NewGuid():N}"[..16];
        var temps = new List<string>(files.Count);
        var asides = new List<(string Final, string Aside)>();
        var placed = new List<string>();
        try
        {
            for (int i = 0; i < files.Count; i++)
            {
                cancel.ThrowIfCancellationRequested();
                Directory.CreateDirectory(Path.GetDirectoryName(targets[i])!);
                string temp = $"{targets[i]}.{tag}.part";
                Pending[temp] = null;
                temps.Add(temp);
                using var stream = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None);
                files[i].Write(stream);
                stream.Flush(flushToDisk: true);
            }

            cancel.ThrowIfCancellationRequested();
            for (int i = 0; i < targets.Count; i++)
            {
                if (File.Exists(targets[i]))
                {
                    string aside = $"{targets[i]}.{tag}.old";
                    Pending[aside] = targets[i];
                    File.Move(targets[i], aside);
                    asides.Add((targets[i], aside));
                }

                File.Move(temps[i], targets[i]);
                placed.Add(targets[i]);
            }
        }
        catch
        {
            foreach (string final in placed)
            {
                TryDelete(final);
            }

            foreach ((string final, string aside) in asides)
            {
                TryMove(aside, final);
            }

            foreach (string temp in temps)
            {
                TryDelete(temp);
            }

            Forget(temps, asides);
            throw;
        }

        foreach ((_, string aside) in asides)
        {
            TryDelete(aside);
        }

        Forget(temps, asides);
    }

    /// <summary>Full paths of the targets, after checking that none repeats and none is a folder.</summary>
    private static List<string> CheckTargets(IEnumerable<string> paths)
    {
        var targets = new List<string>();
        foreach (string path in paths)
        {
            string full = Path.GetFullPath(path);
            if (Directory.Exists(full))
            {
                throw new IOException($"{path} is a folder: give a file name");
            }

            if (targets.Contains(full, StringComparer.Ordinal))
            {
                throw new IOException($"{path} is named for two outputs: give each its own file");
            }

            targets.Add(full);
        }

        return targets;
    }

    private static void Forget(List<string> temps, List<(string Final, string Aside)> asides)
    {
        foreach (string temp in temps)
        {
            Pending.TryRemove(temp, out _);
        }

        foreach ((_, string aside) in asides)
        {
            Pending.TryRemove(aside, out _);
        }
    }

    private static void RemovePending()
    {
        foreach ((string path, string? restoreTo) in Pending)
        {
            // An aside copy is the user's previous file: put it back rather than lose it.
            if (restoreTo != null)
            {
                TryMove(path, restoreTo);
            }
            else
            {
                TryDelete(path);
            }
        }
    }

    private static void TryMove(string from, string to)
    {
        try
        {
            File.Move(from, to, overwrite: true);
        }
        catch (IOException)
        {
        }
        catch (UnauthorizedAccessException)
        {
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
