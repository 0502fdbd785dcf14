using System.Collections.Concurrent;

namespace LaunchLogger.Cli.Output;

/// <summary>Writes a set of files all or none: a failure or Ctrl+C never leaves a half-written
/// file, nor some of the set written and the rest not.</summary>
/// <remarks>
/// <para>Each file is written to a temporary file of its own beside its target (a distinct name
/// per file and process, so two targets never share one). Only when every one is written are they
/// moved into place; a target that existed is first moved aside, and put back if a later move
/// fails. Targets are checked first: two of them naming one file, or a target that is a folder,
/// fail before anything is moved.</para>
/// <para>A verb that makes its files one at a time while it streams runs (and learns their final
/// names only at the end) uses an <see cref="AtomicFile.Set"/>: each file is written to its
/// temporary file as soon as it is made and let go, and the set is moved into place at the end.</para>
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
        CheckTargets(files.Select(f => f.Path));
        using var set = new Set();
        foreach ((string path, Action<Stream> write) in files)
        {
            cancel.ThrowIfCancellationRequested();
            set.Write(path, write);
        }

        set.Commit(files.Select(f => f.Path).ToList(), cancel);
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

    /// <summary>Files written one at a time to temporary files and moved into place together by
    /// <see cref="Commit"/>; disposed without a commit (a failure, Ctrl+C), it removes them all.</summary>
    public sealed class Set : IDisposable
    {
        private readonly string tag = $"{Environment.ProcessId}.{Guid.NewGuid():N}"[..16];
        private readonly List<string> temps = [];
        private bool committed;

        /// <summary>Files written so far.</summary>
        public int Count => temps.Count;

        /// <summary>Writes one file of the set to a temporary file beside <paramref name="nearPath"/>
        /// (its final name, or one in the same folder when that is known only later).</summary>
        /// <returns>Its position in the set, for <see cref="Commit"/>.</returns>
        /// <exception cref="IOException">It could not be written.</exception>
        /// <exception cref="UnauthorizedAccessException">The folder cannot be written to.</exception>
        public int Write(string nearPath, Action<Stream> write)
        {
            ObjectDisposedException.ThrowIf(committed, this);
            string near = Path.GetFullPath(nearPath);
            Directory.CreateDirectory(Path.GetDirectoryName(near)!);
            string temp = $"{near}.{tag}.{temps.Count}.part";
            Pending[temp] = null;
            temps.Add(temp);
            using var stream = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None);
            write(stream);
            stream.Flush(flushToDisk: true);
            return temps.Count - 1;
        }

        /// <summary>Moves file i of the set to <paramref name="targets"/>[i], all or none.</summary>
        /// <exception cref="ArgumentException">Not one target per file written.</exception>
        /// <exception cref="IOException">Two targets name one file, a target is a folder, or a move failed (nothing is changed).</exception>
        /// <exception cref="OperationCanceledException">Cancelled before the files were moved.</exception>
        public void Commit(IReadOnlyList<string> targets, CancellationToken cancel = default)
        {
            ObjectDisposedException.ThrowIf(committed, this);
            if (targets.Count != temps.Count)
            {
                throw new ArgumentException($"{temps.Count} file(s) written but {targets.Count} target(s) given", nameof(targets));
            }

            List<string> finals = CheckTargets(targets);
            var asides = new List<(string Final, string Aside)>();
            var placed = new List<string>();
            try
            {
                cancel.ThrowIfCancellationRequested();
                for (int i = 0; i < finals.Count; i++)
                {
                    if (File.Exists(finals[i]))
                    {
                        string aside = $"{finals[i]}.{tag}.old";
                        Pending[aside] = finals[i];
                        File.Move(finals[i], aside);
                        asides.Add((finals[i], aside));
                    }

                    File.Move(temps[i], finals[i]);
                    placed.Add(finals[i]);
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
                    Pending.TryRemove(aside, out _);
                }

                throw;
            }

            foreach ((_, string aside) in asides)
            {
                TryDelete(aside);
                Pending.TryRemove(aside, out _);
            }

            foreach (string temp in temps)
            {
                Pending.TryRemove(temp, out _);
            }

            temps.Clear();
            committed = true;
        }

        /// <summary>Removes every temporary file not moved into place.</summary>
        public void Dispose()
        {
            foreach (string temp in temps)
            {
                TryDelete(temp);
                Pending.TryRemove(temp, out _);
            }

            temps.Clear();
            committed = true;
        }
    }
}
