using LaunchLogger.Archive;

namespace LaunchLogger.Board.Web;

/// <summary>Watches one archive for changes: a single loop reads its change stamp
/// (<see cref="SessionArchive.ChangeStamp"/>, a few index look-ups) every poll interval over one
/// read-only connection, and wakes every update stream waiting for a change.</summary>
internal sealed class ArchiveWatcher : IDisposable
{
    private readonly SessionArchive archive;
    private readonly TimeSpan poll;
    private readonly object gate = new();
    private TaskCompletionSource<string> next = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private string stamp;

    public ArchiveWatcher(string archivePath, TimeSpan poll)
    {
        archive = SessionArchive.OpenReadOnly(archivePath);
        this.poll = poll;
        stamp = archive.ChangeStamp();
    }

    /// <summary>The stamp last read.</summary>
    public string Stamp
    {
        get
        {
            lock (gate)
            {
                return stamp;
            }
        }
    }

    /// <summary>Polls until <paramref name="stop"/> is cancelled.</summary>
    public async Task RunAsync(CancellationToken stop)
    {
        using var timer = new PeriodicTimer(poll);
        try
        {
            while (await timer.WaitForNextTickAsync(stop))
            {
                string now;
                try
                {
                    now = archive.ChangeStamp();
                }
                catch (Microsoft.Data.Sqlite.SqliteException)
                {
                    // A writer holding the file past the busy timeout: try again next tick.
                    continue;
                }

                TaskCompletionSource<string>? woken = null;
                lock (gate)
                {
                    if (now != stamp)
                    {
                        stamp = now;
                        woken = next;
                        next = new TaskCompletionSource<string>(TaskCreationOptions.RunContinuationsAsynchronously);
                    }
                }

                woken?.TrySetResult(now);
            }
        }
        catch (OperationCanceledException)
        {
        }
    }

    /// <summary>The stamp once it differs from <paramref name="known"/>; null when nothing changed
    /// within <paramref name="wait"/>.</summary>
    public async Task<string?> ChangedAsync(string known, TimeSpan wait, CancellationToken cancel)
    {
        Task<string> changed;
        lock (gate)
        {
            if (stamp != known)
            {
                return stamp;
            }

            changed = next.Task;
        }

        Task done = await Task.WhenAny(changed, Task.Delay(wait, cancel));
        cancel.ThrowIfCancellationRequested();
        return done == changed ? await changed : null;
    }

    public void Dispose() => archive.Dispose();
}
