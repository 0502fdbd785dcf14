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
/// <para>Health counters run since power-up, so each run's are differenced against the last
/// health frame of the previous run of the same power-up (or against zero for run 1); when that
/// run is not in the log, against the run's own first health frame. The widest bracket is a
/// maximum and is reported as read.</para>
/// </remarks>
public sealed class RunAssembler
{
    private readonly string source;
    private readonly List<DecodedRun> runs = [];
    private readonly List<string> warnings = [];
    private readonly RunScratch scratch = new();
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
    private bool completed;

    /// <summary>Starts assembling the runs of the log called <paramref name="sourceName"/>.</summary>
    public RunAssembler(string sourceName)
    {
        ArgumentNullException.ThrowIfNull(sourceName);
        source = sourceName;
    }

    /// <summary>Runs finished so far, in log order (a live reader can show them as they close).</summary>
    public IReadOnlyList<DecodedRun> Runs => runs;

    /// <summary>Takes one good frame.</summary>
    /// <param name="frame">A frame <see cref="FrameReader.TryReadFrame"/> returned with Done.</param>
    /// <param name="readerStats">The reader's counters right after it returned the frame.</param>
    /// <exception cref="InvalidOperationException"><see cref="Complete"/> was called already.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Add(in Frame frame, in ReaderStats readerStats)
    {
        ThrowIfCompleted();
        ChargeDamage(readerStats);
        if (frame.Type == FrameType.Configuration)
        {
            Open(frame.Body, frame.Sequence);
            return;
        }

        if (open == null)
        {
            orphanFrames++;
            return;
        }

        open.Frames++;
        bool parsed = true;
        switch (frame.Type)
        {
            case FrameType.Pulses:
                parsed = open.AddPulses(frame.Body);
                break;
            case FrameType.Acceleration:
                parsed = FrameBodies.TryReadAcceleration(frame.Body, out AccelerationBody accel);
                if (parsed)
                {
                    open.AddAcceleration(accel);
                }

                break;
            case FrameType.Event:
                parsed = FrameBodies.TryReadEvent(frame.Body, out EventBody evt);
                if (parsed)
                {
                    open.AddEvent(evt);
                }

                break;
            case FrameType.Health:
                parsed = FrameBodies.TryReadHealth(frame.Body, out HealthBody health);
                if (parsed)
                {
                    open.AddHealth(health);
                }

                break;
            case FrameType.Summary:
                parsed = FrameBodies.TryReadSummary(frame.Body, out SummaryBody summary);
                if (parsed)
                {
                    open.Summary = summary;
                    Close(null);
                }

                break;
            default:
                open.UnknownFrames++;
                break;
        }

        if (!parsed)
        {
            corruptBodies++;
            open.CorruptBodies++;
        }
    }

    /// <summary>Ends the log: closes a run left open as cut off and returns everything.</summary>
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

        scratch.Dispose();
        ReaderStats stats = readerStats with { CorruptBodies = corruptBodies, OrphanFrames = orphanFrames };
        WarnOutsideRuns(stats);
        return new LogReadResult
        {
            Source = source,
            Runs = runs.ToList(),
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
        powerUp += now.Restarts - seen.Restarts;
        seen = now;
        if (open != null)
        {
            open.CrcErrors += crc;
            open.MalformedFrames += malformed;
            open.FramesLost += lost;
        }
        else
        {
            outsideCrcErrors += crc;
            outsideMalformed += malformed;
            outsideLost += lost;
            outsideTruncated += truncated;
        }
    }

    private void Open(ReadOnlySpan<byte> body, int sequence)
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
            if (open != null)
            {
                Close("cut off: an unreadable configuration frame followed before this run's summary");
            }

            if (body.Length > 0 && body[0] != LogFormat.Version)
            {
                warnings.Add(Invariant($"a run in log format version {body[0]} was skipped: this reader knows version {LogFormat.Version}"));
            }

            return;
        }

        if (open != null)
        {
            Close("cut off: the next run's configuration came before this run's summary");
        }

        string name = powerUp == 0
            ? Invariant($"{source} run {configuration.RunNumber}")
            : Invariant($"{source} run {configuration.RunNumber} (after restart {powerUp})");
        open = new RunBuilder(configuration, name, scratch);
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

        runs.Add(run.Build(baseline));
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
            warnings.Add(Invariant($"{unreadableConfigurations} configuration frame(s) could not be read; their runs were skipped"));
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
