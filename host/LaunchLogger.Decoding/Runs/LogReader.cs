using System.Buffers;
using System.Runtime.CompilerServices;
using System.Runtime.ExceptionServices;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Reads a whole log — bytes in memory, a stream or a file — into runs: the entry point
/// that joins <see cref="FrameReader"/> and <see cref="RunAssembler"/>.</summary>
/// <remarks>Damaged or cut-off input never throws: it shows in the result's counters and
/// warnings. A stream is read in blocks and never buffered whole. The frames are read on the
/// caller's thread; each run, once closed, is built on the thread pool while the frames after it
/// are read (<see cref="RunPipeline"/>), and the runs come out in log order, the same as when
/// built one after the other.</remarks>
public static class LogReader
{
    private const int StreamBlockBytes = 64 * 1024;

    /// <summary>Reads a log held in memory.</summary>
    /// <param name="bytes">The whole log.</param>
    /// <param name="sourceName">Its name, used in run sources and messages.</param>
    /// <exception cref="ArgumentNullException"><paramref name="sourceName"/> is null.</exception>
    public static LogReadResult Read(ReadOnlySpan<byte> bytes, string sourceName) => Read(bytes, sourceName, RunPipeline.ForThisMachine());

    /// <summary>As <see cref="Read(ReadOnlySpan{byte}, string)"/>, with the runs built by
    /// <paramref name="pipeline"/>, which is disposed at the end.</summary>
    internal static LogReadResult Read(ReadOnlySpan<byte> bytes, string sourceName, RunPipeline pipeline)
    {
        ArgumentNullException.ThrowIfNull(sourceName);
        using RunPipeline owned = pipeline;
        var assembler = new RunAssembler(sourceName, pipeline.Post);
        var reader = default(FrameReader);
        Span<byte> payload = stackalloc byte[LogFormat.MaxPayloadBytes];
        var runs = new List<DecodedRun>();
        int used = 0;
        bool paused;
        do
        {
            used += Pump(ref reader, bytes[used..], isFinalBlock: true, payload, assembler, pipeline, out paused);
            while (pipeline.IsFull || pipeline.OldestBuilt)
            {
                runs.Add(pipeline.Take());
            }
        }
        while (paused);

        LogReadResult end = assembler.Complete(reader.Stats);
        while (pipeline.Count > 0)
        {
            runs.Add(pipeline.Take());
        }

        return Finished(end, pipeline, runs);
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

        return new LogReadResult { Source = end!.Source, Runs = runs, BenchRests = end.BenchRests, Stats = end.Stats, Warnings = end.Warnings };
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
        return Blocks(stream, sourceName, completed, () => RunPipeline.ForThisMachine(), cancellationToken);
    }

    /// <summary>As <see cref="ReadRuns(Stream, string, Action{LogReadResult}?, CancellationToken)"/>,
    /// with the runs built by <paramref name="pipeline"/>, which is disposed when the runs end.</summary>
    internal static IEnumerable<DecodedRun> ReadRuns(Stream stream, string sourceName, RunPipeline pipeline, Action<LogReadResult>? completed = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentNullException.ThrowIfNull(sourceName);
        ArgumentNullException.ThrowIfNull(pipeline);
        return Blocks(stream, sourceName, completed, () => pipeline, cancellationToken);
    }

    /// <summary>As <see cref="ReadRuns(Stream, string, Action{LogReadResult}?, CancellationToken)"/>
    /// for a file, which is opened now (a missing file fails here) and closed when the runs end.</summary>
    /// <exception cref="InputException">The file is missing or cannot be opened.</exception>
    public static IEnumerable<DecodedRun> ReadFileRuns(string path, Action<LogReadResult>? completed = null, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(path);
        FileStream stream = InputFiles.Open(path);
        return Closing(stream, Blocks(stream, Path.GetFileName(path), completed, () => RunPipeline.ForThisMachine(), cancellationToken));

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

    /// <remarks>A stop between blocks — cancellation, or the stream failing — comes after every run
    /// closed before it has been handed out, as when runs were built inline; a run whose build
    /// threw throws when its turn comes. Leaving the loop early waits for the builds under way.</remarks>
    private static IEnumerable<DecodedRun> Blocks(Stream stream, string sourceName, Action<LogReadResult>? completed, Func<RunPipeline> newPipeline, CancellationToken cancellationToken)
    {
        using RunPipeline pipeline = newPipeline();
        var assembler = new RunAssembler(sourceName, pipeline.Post);
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        byte[] block = new byte[StreamBlockBytes];
        int filled = 0;
        while (true)
        {
            int got = 0;
            ExceptionDispatchInfo? stop = null;
            try
            {
                cancellationToken.ThrowIfCancellationRequested();
                got = stream.Read(block, filled, block.Length - filled);
            }
            catch (Exception e)
            {
                stop = ExceptionDispatchInfo.Capture(e);
            }

            if (stop != null)
            {
                while (pipeline.Count > 0)
                {
                    yield return pipeline.Take();
                }

                stop.Throw();
            }

            filled += got;
            bool final = got == 0;
            int used = 0;
            bool paused;
            do
            {
                used += Pump(ref reader, block.AsSpan(used, filled - used), final, payload, assembler, pipeline, out paused);
                while (pipeline.IsFull || pipeline.OldestBuilt)
                {
                    yield return pipeline.Take();
                }
            }
            while (paused);

            // The reader leaves at most one unfinished frame (≤ MaxEncodedFrameBytes) unconsumed.
            block.AsSpan(used, filled - used).CopyTo(block);
            filled -= used;
            if (final)
            {
                LogReadResult end = assembler.Complete(reader.Stats);
                while (pipeline.Count > 0)
                {
                    yield return pipeline.Take();
                }

                completed?.Invoke(Finished(end, pipeline, []));
                yield break;
            }
        }
    }

    /// <summary>The assembler's result with <paramref name="runs"/> and the bodies found corrupt
    /// when the runs were built.</summary>
    private static LogReadResult Finished(LogReadResult end, RunPipeline pipeline, IReadOnlyList<DecodedRun> runs) => new()
    {
        Source = end.Source,
        Runs = runs,
        BenchRests = end.BenchRests,
        Stats = end.Stats with { CorruptBodies = end.Stats.CorruptBodies + pipeline.CorruptBodies },
        Warnings = end.Warnings,
    };

    /// <summary>Reads the input's frames into the assembler until it needs more data, or until
    /// <paramref name="pipeline"/> is full (<paramref name="paused"/>: call again with the rest
    /// once a run has been taken); returns the bytes used.</summary>
    /// <remarks>Fully optimised from the first call: a whole log in memory is one long call,
    /// which tiered compilation would otherwise run in its less optimised on-stack-replacement code.</remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int Pump(ref FrameReader reader, ReadOnlySpan<byte> input, bool isFinalBlock, Span<byte> payload, RunAssembler assembler, RunPipeline pipeline, out bool paused)
    {
        int offset = 0;
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(input[offset..], payload, isFinalBlock, out int used, out Frame frame);
            offset += used;
            if (status == OperationStatus.Done)
            {
                assembler.Add(frame, reader.Stats);
                if (pipeline.IsFull)
                {
                    paused = true;
                    return offset;
                }
            }
            else if (status == OperationStatus.NeedMoreData)
            {
                paused = false;
                return offset;
            }
        }
    }
}
