using System.Runtime.CompilerServices;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Groups good frames into runs and builds a <see cref="DecodedRun"/> for each: a
/// configuration frame opens a run, its summary closes it.</summary>
/// <remarks>
/// <para>Feed it every frame <see cref="FrameReader"/> returns, with the reader's counters at that
/// moment, then call <see cref="Complete"/>. Damage the counters show between two frames (CRC
/// errors, malformed frames, sequence gaps) is charged to the run open at the time and reported in
/// its warnings; damage outside any run goes to the log's warnings.</para>
/// <para>A run without its summary — the next configuration came first, or the log ended — is
/// built anyway, marked incomplete, with a warning saying why. Frames before the first
/// configuration (a capture that started mid-run) or between a summary and the next configuration
/// are counted in <see cref="ReaderStats.OrphanFrames"/>. Bodies that do not parse are counted in
/// <see cref="ReaderStats.CorruptBodies"/> and skipped.</para>
/// <para>A bench rest (frames 0x09 … 0x0A, only acceleration frames between) is no run: its
/// samples go to a <see cref="BenchRestRecord"/> in <see cref="LogReadResult.BenchRests"/>, and
/// the runs never see it. A run's configuration, a restart or the log's end before its end frame
/// leaves it <see cref="BenchRestOutcome.Unfinished"/>.</para>
/// <para>Health counters run since power-up, so each run's are differenced against the last
/// health frame of the previous run of the same power-up (or against zero for run 1); when that
/// run is not in the log, against the run's own first health frame. The widest bracket is a
/// maximum and is reported as read.</para>
/// <para>A closed run is built here, before <see cref="Add"/> returns — or, for
/// <see cref="LogReader"/>, handed to a <see cref="RunPipeline"/> that builds it on another
/// thread: everything a build needs is settled when its run closes.</para>
/// </remarks>
public sealed class RunAssembler
{
    private readonly string source;
    private readonly List<DecodedRun> runs = [];
    private readonly List<BenchRestRecord> rests = [];
    private BenchRestBuilder? rest;
    private readonly List<string> warnings = [];
    private readonly Action<RunBuilder, long[]?>? handOff;
    private RunScratch? scratch;
    private RunBuilder? open;
    private ReaderStats seen;
    private long corruptBodies;
    private long orphanFrames;
    private long outsideCrcErrors;
    private long outsideMalformed;
    private long outsideLost;
    private long outsideTruncated;
    private long unreadableConfigurations;
    private long powerUp;
    private long previousRunNumber = -1;
    private long previousRunPowerUp = -1;
    private long[]? previousRunLastHealth;
    private ConfigurationBody? previousConfiguration;
    private long recoveredConfigurations;
    private long orphanBytes;
    private bool completed;

    /// <summary>The most frames (and bytes) kept while no run is open, waiting for a copy of their
    /// run's configuration: about a minute of a busy run.</summary>
    private const int MaxOrphansKept = 65_536;

    private const long MaxOrphanBytesKept = 16L * 1024 * 1024;

    private readonly List<(FrameType Type, byte[] Body)> orphans = [];

    /// <summary>Starts assembling the runs of the log called <paramref name="sourceName"/>.</summary>
    public RunAssembler(string sourceName)
    {
        ArgumentNullException.ThrowIfNull(sourceName);
        source = sourceName;
    }

    /// <summary>Starts assembling runs that are handed, as each closes, to
    /// <paramref name="closed"/> with the health baseline to build it with, instead of being
    /// built here: <see cref="Runs"/> stays empty, and the bodies that fail to parse at build
    /// time (<see cref="RunBuilder.CorruptBodiesAtBuild"/>) are not in the counters
    /// <see cref="Complete"/> returns.</summary>
    internal RunAssembler(string sourceName, Action<RunBuilder, long[]?> closed)
        : this(sourceName)
    {
        handOff = closed;
    }

    /// <summary>Runs finished so far and not taken, in log order (a live reader can show them as
    /// they close).</summary>
    public IReadOnlyList<DecodedRun> Runs => runs;

    /// <summary>Hands over the oldest finished run and forgets it, so that a reader working
    /// through a long log holds one run at a time (<see cref="Complete"/> returns only the runs
    /// not taken).</summary>
    /// <returns>False when no finished run is waiting.</returns>
    public bool TryTakeRun([System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out DecodedRun? run)
    {
        if (runs.Count == 0)
        {
            run = null;
            return false;
        }

        run = runs[0];
        runs.RemoveAt(0);
        return true;
    }

    /// <summary>Takes one good frame.</summary>
    /// <param name="frame">A frame <see cref="FrameReader.TryReadFrame"/> returned with Done.</param>
    /// <param name="readerStats">The reader's counters right after it returned the frame.</param>
    /// <exception cref="InvalidOperationException"><see cref="Complete"/> was called already.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Add(in Frame frame, in ReaderStats readerStats)
    {
        ThrowIfCompleted();
        ChargeDamage(readerStats);
        switch (frame.Type)
        {
            case FrameType.Configuration:
                CloseRest("cut off: a run's configuration came before the rest's end frame");
                Open(frame.Body, frame.Sequence, isCopy: false);
                return;
            case FrameType.ConfigurationCopy:
                CloseRest("cut off: a run's configuration came before the rest's end frame");
                Open(frame.Body, frame.Sequence, isCopy: true);
                return;
            case FrameType.PowerUp:
                // The restart it marks has been seen by the reader (ChargeDamage closed any open run).
                return;
            case FrameType.BenchRest:
                OpenRest(frame.Body);
                return;
            case FrameType.BenchRestEnd:
                EndRest(frame.Body);
                return;
        }

        if (rest != null && open == null)
        {
            if (frame.Type == FrameType.Acceleration && FrameBodies.TryReadAcceleration(frame.Body, out AccelerationBody samples))
            {
                rest.Add(samples);
            }
            else if (frame.Type == FrameType.Acceleration)
            {
                corruptBodies++;
                rest.FramesLost++;
            }

            return;
        }

        if (open == null)
        {
            KeepOrphan(frame.Type, frame.Body);
            return;
        }

        Process(frame.Type, frame.Body);
    }

    /// <summary>Adds one frame of the open run.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Process(FrameType type, ReadOnlySpan<byte> body)
    {
        RunBuilder run = open!;
        run.Frames++;
        bool parsed = true;
        switch (type)
        {
            case FrameType.Pulses:
            case FrameType.Acceleration:
                // Parsed when the run is built (and counted then if they do not parse).
                run.Keep(type, body);
                break;
            case FrameType.Event:
                parsed = FrameBodies.TryReadEvent(body, out EventBody evt);
                if (parsed)
                {
                    run.AddEvent(evt);
                }

                break;
            case FrameType.Health:
                parsed = FrameBodies.TryReadHealth(body, out HealthBody health);
                if (parsed)
                {
                    run.AddHealth(health);
                }

                break;
            case FrameType.Summary:
                parsed = FrameBodies.TryReadSummary(body, out SummaryBody summary);
                if (parsed)
                {
                    run.Summary = summary;
                    Close(null);
                }

                break;
            default:
                run.UnknownFrames++;
                break;
        }

        if (!parsed)
        {
            corruptBodies++;
            run.CorruptBodies++;
        }
    }

    /// <summary>Keeps a frame that came with no run open: its run's configuration may have been
    /// damaged, and a repeated copy (or, failing that, its summary) may still open the run.</summary>
    private void KeepOrphan(FrameType type, ReadOnlySpan<byte> body)
    {
        orphanFrames++;
        if (type == FrameType.Summary && FrameBodies.TryReadSummary(body, out SummaryBody summary) && TryOpenFromPrevious(summary))
        {
            return;
        }

        if (orphans.Count < MaxOrphansKept && orphanBytes + body.Length <= MaxOrphanBytesKept)
        {
            orphans.Add((type, body.ToArray()));
            orphanBytes += body.Length;
        }
    }

    /// <summary>Feeds the kept orphans to the run just opened (they follow its configuration in
    /// the log, so they are its frames); returns how many it took.</summary>
    private int AdoptOrphans()
    {
        int adopted = 0;
        foreach ((FrameType type, byte[] body) in orphans)
        {
            if (open == null)
            {
                break;
            }

            orphanFrames--;
            adopted++;
            Process(type, body);
        }

        DropOrphans();
        return adopted;
    }

    private void DropOrphans()
    {
        orphans.Clear();
        orphanBytes = 0;
    }

    /// <summary>Old logs have no configuration copies. When a run's configuration was lost but its
    /// summary follows the previous run of the same power-up in number, the box had the same
    /// settings: the run is decoded with them, its number and opening from the summary.</summary>
    private bool TryOpenFromPrevious(SummaryBody summary)
    {
        if (previousConfiguration == null || orphans.Count == 0 || previousRunPowerUp != powerUp
            || summary.RunNumber != previousConfiguration.RunNumber + 1 || summary.OpenedMicros < previousConfiguration.OpenedMicros)
        {
            return false;
        }

        ConfigurationBody assumed = previousConfiguration with { RunNumber = summary.RunNumber, OpenedMicros = summary.OpenedMicros, Staged = summary.Staged };
        OpenRun(assumed);
        open!.Warn(Invariant($"this run's configuration frame was lost: decoded with run {previousConfiguration.RunNumber}'s settings (same power-up), its number and opening taken from its summary"));
        recoveredConfigurations++;
        orphanFrames--;
        AdoptOrphans();
        if (open != null)
        {
            open.Frames++;
            open.Summary = summary;
            Close(null);
        }

        return true;
    }

    /// <summary>Ends the log: closes a run left open as cut off and returns everything (of the
    /// runs, those not taken with <see cref="TryTakeRun"/>).</summary>
    /// <param name="readerStats">The reader's counters after its final call.</param>
    /// <exception cref="InvalidOperationException">Called twice.</exception>
    public LogReadResult Complete(in ReaderStats readerStats)
    {
        ThrowIfCompleted();
        ChargeDamage(readerStats);
        completed = true;
        if (open != null)
        {
            Close(open.Summary == null && readerStats.TruncatedBytes > 0
                ? "cut off: the log ends inside a frame before this run's summary (power lost or capture stopped)"
                : "cut off: the log ends before this run's summary (power lost or capture stopped)");
        }

        CloseRest("cut off: the log ends before the rest's end frame (power lost or capture stopped)");
        scratch?.Dispose();
        ReaderStats stats = readerStats with { CorruptBodies = corruptBodies, OrphanFrames = orphanFrames };
        WarnOutsideRuns(stats);
        return new LogReadResult
        {
            Source = source,
            Runs = runs.ToList(),
            BenchRests = rests.ToList(),
            Stats = stats,
            Warnings = warnings.ToList(),
        };
    }

    private void ThrowIfCompleted()
    {
        if (completed)
        {
            throw new InvalidOperationException("the log has been completed already");
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void ChargeDamage(in ReaderStats now)
    {
        long crc = now.CrcErrors - seen.CrcErrors;
        long malformed = now.MalformedFrames - seen.MalformedFrames;
        long lost = now.FramesLost - seen.FramesLost;
        long truncated = now.TruncatedBytes - seen.TruncatedBytes;
        long restarts = now.Restarts - seen.Restarts;
        long breaks = now.SequenceBreaks - seen.SequenceBreaks;
        powerUp += restarts;
        seen = now;
        if (restarts + breaks > 0)
        {
            CloseRest(restarts > 0
                ? "cut off: the box restarted before the rest's end frame (power lost)"
                : "cut off: the sequence numbers jump back before the rest's end frame");
            if (open != null)
            {
                Close(restarts > 0
                    ? "cut off: the box restarted before this run's summary (power lost)"
                    : "cut off: the sequence numbers jump back before this run's summary (another log or a replayed stretch follows)");
            }

            DropOrphans();
        }

        if (open != null)
        {
            open.CrcErrors += crc;
            open.MalformedFrames += malformed;
            open.FramesLost += lost;
        }
        else if (rest != null)
        {
            rest.FramesLost += crc + malformed + lost;
        }
        else
        {
            outsideCrcErrors += crc;
            outsideMalformed += malformed;
            outsideLost += lost;
            outsideTruncated += truncated;
        }
    }

    private void Open(ReadOnlySpan<byte> body, int sequence, bool isCopy)
    {
        bool readable = FrameBodies.TryReadConfiguration(body, out ConfigurationBody configuration);
        string? implausible = readable ? InputLimits.CheckConfiguration(configuration) : null;
        if (implausible != null)
        {
            warnings.Add(Invariant($"the configuration frame with sequence number {sequence} was rejected: {implausible}"));
            readable = false;
        }

        if (!readable)
        {
            corruptBodies++;
            unreadableConfigurations++;
            if (isCopy)
            {
                // A damaged copy costs only itself: the open run (if any) goes on.
                return;
            }

            if (open != null)
            {
                Close("cut off: an unreadable configuration frame followed before this run's summary");
            }

            if (body.Length > 0 && body[0] != LogFormat.Version)
            {
                warnings.Add(Invariant($"a run in log format version {body[0]} was skipped: this reader knows version {LogFormat.Version}"));
            }

            DropOrphans();
            return;
        }

        if (isCopy && open != null && open.Configuration == configuration)
        {
            // The periodic repeat of the open run's configuration.
            open.Frames++;
            return;
        }

        if (isCopy && open == null && configuration == previousConfiguration && previousRunPowerUp == powerUp)
        {
            orphanFrames++;
            return;
        }

        if (open != null)
        {
            Close("cut off: the next run's configuration came before this run's summary");
        }

        OpenRun(configuration);
        if (isCopy)
        {
            // The run's own configuration frame was lost: what came before this copy is its.
            recoveredConfigurations++;
            int adopted = orphans.Count;
            open!.Frames++;
            AdoptOrphans();
            open?.Warn(Invariant($"this run's configuration frame was lost: decoded from its repeated copy (sequence number {sequence}); {adopted} frame(s) before the copy recovered"));
        }
        else
        {
            DropOrphans();
        }
    }

    /// <summary>A bench rest opens: a run still open was cut off, and so was an earlier rest.</summary>
    private void OpenRest(ReadOnlySpan<byte> body)
    {
        if (!FrameBodies.TryReadBenchRest(body, out BenchRestBody opening))
        {
            corruptBodies++;
            return;
        }

        if (open != null)
        {
            Close("cut off: a bench rest began before this run's summary");
        }

        CloseRest("cut off: the next bench rest began before this one's end frame");
        DropOrphans();
        rest = new BenchRestBuilder(opening, powerUp == 0 ? source : Invariant($"{source} (after restart {powerUp})"));
    }

    /// <summary>The rest's end frame: the open rest is finished (one whose opening was lost
    /// stays unread, its samples counted outside any run).</summary>
    private void EndRest(ReadOnlySpan<byte> body)
    {
        if (!FrameBodies.TryReadBenchRestEnd(body, out BenchRestEndBody end))
        {
            corruptBodies++;
            CloseRest("its end frame is damaged: how it ended is not known");
            return;
        }

        if (rest == null)
        {
            orphanFrames++;
            return;
        }

        rests.Add(rest.Build(end, null));
        rest = null;
    }

    /// <summary>Finishes the open rest, if any, without its end frame, saying why.</summary>
    private void CloseRest(string why)
    {
        if (rest != null)
        {
            rests.Add(rest.Build(null, why));
            rest = null;
        }
    }

    private void OpenRun(ConfigurationBody configuration)
    {
        string name = powerUp == 0
            ? Invariant($"{source} run {configuration.RunNumber}")
            : Invariant($"{source} run {configuration.RunNumber} (after restart {powerUp})");
        open = new RunBuilder(configuration, name);
    }

    private void Close(string? cutOffReason)
    {
        RunBuilder run = open!;
        open = null;
        if (cutOffReason != null)
        {
            run.Warn(cutOffReason);
        }

        long runNumber = run.Configuration.RunNumber;
        long[]? baseline;
        if (runNumber == 1)
        {
            baseline = null;
        }
        else if (previousRunNumber == runNumber - 1 && previousRunPowerUp == powerUp && previousRunLastHealth != null)
        {
            baseline = previousRunLastHealth;
        }
        else
        {
            baseline = run.FirstHealth?.Counters;
        }

        if (handOff != null)
        {
            handOff(run, baseline);
        }
        else
        {
            scratch ??= new RunScratch();
            runs.Add(run.Build(baseline, scratch));
            corruptBodies += run.CorruptBodiesAtBuild;

            // The run holds its own arrays now: a long run's collection buffers are let go before
            // the reader's caller works on it.
            scratch.ClearAndShrink();
        }

        previousConfiguration = run.Configuration;
        previousRunNumber = runNumber;
        previousRunPowerUp = powerUp;
        previousRunLastHealth = run.LastHealth?.Counters;
    }

    private void WarnOutsideRuns(in ReaderStats stats)
    {
        if (stats.Frames == 0 && stats.Bytes > 0)
        {
            warnings.Add("no readable frames: this is not a log, or it is badly damaged");
        }

        if (orphanFrames > 0)
        {
            warnings.Add(Invariant($"{orphanFrames} frame(s) outside any run were skipped: the capture began after a run opened, or a configuration frame was lost"));
        }

        if (unreadableConfigurations > 0)
        {
            warnings.Add(Invariant($"{unreadableConfigurations} configuration frame(s) could not be read ({recoveredConfigurations} run(s) recovered from a copy or the previous run's settings)"));
        }
        else if (recoveredConfigurations > 0)
        {
            warnings.Add(Invariant($"{recoveredConfigurations} run(s) whose configuration frame was lost were recovered from a copy or the previous run's settings"));
        }

        if (stats.DuplicateFrames > 0)
        {
            warnings.Add(Invariant($"{stats.DuplicateFrames} repeated frame(s) (same sequence number as one already read) were dropped"));
        }

        if (stats.LateFrames > 0)
        {
            warnings.Add(Invariant($"{stats.LateFrames} frame(s) came out of order and were put back in place"));
        }

        if (stats.SequenceBreaks > 0)
        {
            warnings.Add(Invariant($"the sequence numbers jump back {stats.SequenceBreaks} time(s): another log or a replayed stretch is joined on"));
        }

        if (outsideLost > 0)
        {
            warnings.Add(Invariant($"{outsideLost} frame(s) lost between runs (gaps in the sequence numbers)"));
        }

        if (outsideCrcErrors + outsideMalformed > 0)
        {
            warnings.Add(Invariant($"{outsideCrcErrors + outsideMalformed} damaged frame(s) between runs were skipped ({outsideCrcErrors} CRC errors)"));
        }

        if (outsideTruncated > 0)
        {
            warnings.Add(Invariant($"the log ends inside a frame ({outsideTruncated} bytes cut off)"));
        }
    }
}
