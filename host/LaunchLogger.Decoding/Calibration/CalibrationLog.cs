using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>A log read for calibration: its runs, and the counter origins that join them.</summary>
public sealed class CalibrationLog
{
    private CalibrationLog(string path, LogReadResult result, RunOrigins origins)
    {
        Path = path;
        Result = result;
        Origins = origins;
    }

    /// <summary>The file as the user named it.</summary>
    public string Path { get; }

    /// <summary>The runs and the reader's counters.</summary>
    public LogReadResult Result { get; }

    /// <summary>The hardware count at each run's origin.</summary>
    public RunOrigins Origins { get; }

    /// <summary>The runs in log order.</summary>
    public IReadOnlyList<DecodedRun> Runs => Result.Runs;

    /// <summary>The bench rests in log order (not runs).</summary>
    public IReadOnlyList<BenchRestRecord> BenchRests => Result.BenchRests;

    /// <summary>Reads the log file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">Missing, a directory, or unreadable.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static CalibrationLog Read(string path, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(path);
        if (Directory.Exists(path))
        {
            throw new InputException(path, 0, "is a directory, not a file");
        }

        if (!File.Exists(path))
        {
            throw new InputException(path, 0, "file not found");
        }

        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, 0, "cannot be read: " + e.Message.ReplaceLineEndings(" "), e);
        }

        cancellationToken.ThrowIfCancellationRequested();
        LogReadResult result = LogReader.Read(bytes, System.IO.Path.GetFileName(path));
        return new CalibrationLog(path, result, RunOrigins.Read(bytes));
    }
}
