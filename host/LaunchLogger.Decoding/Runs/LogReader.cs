using System.Buffers;
using System.Runtime.CompilerServices;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Reads a whole log — bytes in memory, a stream or a file — into runs: the entry point
/// that joins <see cref="FrameReader"/> and <see cref="RunAssembler"/>.</summary>
/// <remarks>Damaged or cut-off input never throws: it shows in the result's counters and
/// warnings. A stream is read in blocks and never buffered whole.</remarks>
public static class LogReader
{
    private const int StreamBlockBytes = 64 * 1024;

    /// <summary>Reads a log held in memory.</summary>
    /// <param name="bytes">The whole log.</param>
    /// <param name="sourceName">Its name, used in run sources and messages.</param>
    /// <exception cref="ArgumentNullException"><paramref name="sourceName"/> is null.</exception>
    public static LogReadResult Read(ReadOnlySpan<byte> bytes, string sourceName)
    {
        var assembler = new RunAssembler(sourceName);
        var reader = default(FrameReader);
        Span<byte> payload = stackalloc byte[LogFormat.MaxPayloadBytes];
        Pump(ref reader, bytes, isFinalBlock: true, payload, assembler);
        return assembler.Complete(reader.Stats);
    }

    /// <summary>Reads a log from a stream to its end (a file, a captured serial stream).</summary>
    /// <param name="stream">A readable stream; it is not closed.</param>
    /// <param name="sourceName">Its name, used in run sources and messages.</param>
    /// <param name="cancellationToken">Stops reading between blocks.</param>
    /// <exception cref="ArgumentNullException">An argument is null.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    /// <exception cref="IOException">The stream failed.</exception>
    public static LogReadResult Read(Stream stream, string sourceName, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentNullException.ThrowIfNull(sourceName);
        var runs = new List<DecodedRun>();
        LogReadResult? end = null;
        foreach (DecodedRun run in ReadRuns(stream, sourceName, r => end = r, cancellationToken))
        {
            runs.Add(run);
        }

        return new LogReadResult { Source = end!.Source, Runs = runs, Stats = end.Stats, Warnings = end.Warnings };
    }

    /// <summary>Reads a log file.</summary>
    /// <param name="path">The file.</param>
    /// <param name="cancellationToken">Stops reading between blocks.</param>
    /// <exception cref="InputException">The file is missing or cannot be opened.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    /// <exception cref="IOException">Reading failed after the file was opened.</exception>
    public static LogReadResult ReadFile(string path, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(path);
        using FileStream stream = InputFiles.Open(path);
        return Read(stream, Path.GetFileName(path), cancellationToken);
    }

    /// <summary>Reads a log from a stream one run at a time: each run is handed out as soon as it
    /// closes and nothing of it is kept, so memory is bounded by the largest run, not the log.</summary>
    /// <param name="stream">A readable stream; it is not closed. Enumerate the result once.</param>
    /// <param name="sourceName">Its name, used in run sources and messages.</param>
    /// <param name="completed">Called once after the last run with the reader's counters and the
    /// log's own warnings (its <see cref="LogReadResult.Runs"/> is empty: they were handed out).</param>
    /// <param name="cancellationToken">Stops reading between blocks.</param>
    /// <exception cref="ArgumentNullException">An argument is null.</exception>
    public static IEnumerable<DecodedRun> ReadRuns(Stream stream, string sourceName, Action<LogReadResult>? completed = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentNullException.ThrowIfNull(sourceName);
        return Blocks(stream, sourceName, completed, cancellationToken);
    }

    /// <summary>As <see cref="ReadRuns(Stream, string, Action{LogReadResult}?, CancellationToken)"/>
    /// for a file, which is opened now (a missing file fails here) and closed when the runs end.</summary>
    /// <exception cref="InputException">The file is missing or cannot be opened.</exception>
    public static IEnumerable<DecodedRun> ReadFileRuns(string path, Action<LogReadResult>? completed = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(path);
        FileStream stream = InputFiles.Open(path);
        return Closing(stream, Blocks(stream, Path.GetFileName(path), completed, cancellationToken));

        static IEnumerable<DecodedRun> Closing(FileStream stream, IEnumerable<DecodedRun> runs)
        {
            using (stream)
            {
                foreach (DecodedRun run in runs)
                {
                    yield return run;
                }
            }
        }
    }

    private static IEnumerable<DecodedRun> Blocks(Stream stream, string sourceName, Action<LogReadResult>? completed, CancellationToken cancellationToken)
    {
        var assembler = new RunAssembler(sourceName);
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        byte[] block = new byte[StreamBlockBytes];
        int filled = 0;
        while (true)
        {
            cancellationToken.ThrowIfCancellationRequested();
            int got = stream.Read(block, filled, block.Length - filled);
            filled += got;
            bool final = got == 0;
            int used = Pump(ref reader, block.AsSpan(0, filled), final, payload, assembler);

            // The reader leaves at most one unfinished frame (≤ MaxEncodedFrameBytes) unconsumed.
            block.AsSpan(used, filled - used).CopyTo(block);
            filled -= used;
            while (assembler.TryTakeRun(out DecodedRun? run))
            {
                yield return run;
            }

            if (final)
            {
                LogReadResult end = assembler.Complete(reader.Stats);
                foreach (DecodedRun run in end.Runs)
                {
                    yield return run;
                }

                completed?.Invoke(new LogReadResult { Source = end.Source, Runs = [], Stats = end.Stats, Warnings = end.Warnings });
                yield break;
            }
        }
    }

    /// <summary>Reads every frame the input holds into the assembler; returns the bytes used.</summary>
    /// <remarks>Fully optimised from the first call: a whole log in memory is one long call,
    /// which tiered compilation would otherwise run in its less optimised on-stack-replacement code.</remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int Pump(ref FrameReader reader, ReadOnlySpan<byte> input, bool isFinalBlock, Span<byte> payload, RunAssembler assembler)
    {
        int offset = 0;
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(input[offset..], payload, isFinalBlock, out int used, out Frame frame);
            offset += used;
            if (status == OperationStatus.Done)
            {
                assembler.Add(frame, reader.Stats);
            }
            else if (status == OperationStatus.NeedMoreData)
            {
                return offset;
            }
        }
    }
}
