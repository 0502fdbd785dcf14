using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Sinks;

/// <summary>Appends log frames to a file on the board's storage.</summary>
/// <remarks>
/// <para>Durability in two steps. <b>Flush</b> hands buffered bytes to the kernel: after that a
/// crash of this program loses nothing, but a power cut can still lose what the kernel has not
/// written out. <b>fsync</b> (<see cref="FileStream.Flush(bool)"/> with true) makes the kernel
/// write to the card and wait for it: that survives a power cut, but takes milliseconds on an SD
/// card and wears it, so it is rate-limited.</para>
/// <para>Default policy: flush after every frame (frames are a few hundred bytes at most, tens
/// per second, so this is one small <c>write()</c> each) and fsync at most once a second, plus at
/// <see cref="Dispose"/>. A power cut then loses at most about a second of frames, and the log
/// format decodes everything up to the last whole frame. Set <c>flushIntervalMs</c> above 0 to
/// batch writes instead.</para>
/// <para>A write that fails (card removed, disk full) refuses the frame; the frame writer counts
/// that in the health counters. The sink keeps trying with later frames.</para>
/// </remarks>
public sealed class FileByteSink : IByteSink, IDisposable
{
    private readonly FileStream stream;
    private readonly int flushIntervalMs;
    private readonly int fsyncIntervalMs;
    private readonly Func<long> millisecondClock;
    private long lastFlushMs;
    private long lastFsyncMs;

    /// <summary>Creates a new file; never overwrites one.</summary>
    /// <param name="path">The file to create.</param>
    /// <param name="flushIntervalMs">0 flushes every frame; otherwise at most this often.</param>
    /// <param name="fsyncIntervalMs">Least time between fsyncs; 0 fsyncs every frame.</param>
    /// <param name="millisecondClock">A monotonic millisecond clock (default: <see cref="Environment.TickCount64"/>).</param>
    /// <exception cref="IOException">The file exists or cannot be created.</exception>
    public FileByteSink(string path, int flushIntervalMs = 0, int fsyncIntervalMs = 1000, Func<long>? millisecondClock = null)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(flushIntervalMs);
        ArgumentOutOfRangeException.ThrowIfNegative(fsyncIntervalMs);
        Path = path;
        this.flushIntervalMs = flushIntervalMs;
        this.fsyncIntervalMs = fsyncIntervalMs;
        this.millisecondClock = millisecondClock ?? (() => Environment.TickCount64);
        stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.Read, bufferSize: 16384);
        lastFlushMs = lastFsyncMs = this.millisecondClock();
    }

    /// <summary>The file written.</summary>
    public string Path { get; }

    /// <summary>Bytes accepted so far.</summary>
    public long BytesWritten { get; private set; }

    /// <summary>Frames refused because the write, flush or fsync failed.</summary>
    public long WriteFailures { get; private set; }

    /// <summary>Creates a file named after the start time in <paramref name="folder"/> (made if missing).</summary>
    public static FileByteSink CreateInFolder(string folder, DateTime startUtc, int flushIntervalMs, int fsyncIntervalMs)
    {
        Directory.CreateDirectory(folder);
        string name = "launchlog-" + startUtc.ToString("yyyyMMdd-HHmmss", System.Globalization.CultureInfo.InvariantCulture);
        string path = System.IO.Path.Combine(folder, name + ".log");
        for (int n = 2; File.Exists(path); n++)
        {
            path = System.IO.Path.Combine(folder, name + "-" + n + ".log");
        }

        return new FileByteSink(path, flushIntervalMs, fsyncIntervalMs);
    }

    /// <inheritdoc/>
    public bool Write(byte[] buffer, int offset, int count)
    {
        try
        {
            stream.Write(buffer, offset, count);
            BytesWritten += count;
            long now = millisecondClock();
            if (now - lastFsyncMs >= fsyncIntervalMs)
            {
                stream.Flush(flushToDisk: true);
                lastFsyncMs = lastFlushMs = now;
            }
            else if (now - lastFlushMs >= flushIntervalMs)
            {
                stream.Flush();
                lastFlushMs = now;
            }

            return true;
        }
        catch (IOException)
        {
            WriteFailures++;
            return false;
        }
    }

    /// <summary>Flushes, fsyncs and closes the file.</summary>
    public void Dispose()
    {
        try
        {
            stream.Flush(flushToDisk: true);
        }
        catch (IOException)
        {
            WriteFailures++;
        }

        stream.Dispose();
    }
}
