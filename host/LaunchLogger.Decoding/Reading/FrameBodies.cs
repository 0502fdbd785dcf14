using System.Runtime.CompilerServices;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reading;

/// <summary>Parses frame bodies, one method per frame type (LOG-FORMAT.md, section 3).</summary>
/// <remarks>
/// A body that does not parse — a field running past the end, an impossible value, a count that
/// does not match the bytes — makes the method return false; nothing here throws on bad data.
/// Bodies whose size follows from a count (pulses, acceleration) must end exactly there. The
/// others may carry bytes after the fields this reader knows; those are ignored, so that a later
/// writer can append fields without breaking old readers (health counters already work so).
/// </remarks>
public static class FrameBodies
{
    /// <summary>Parses a configuration body. Only <see cref="LogFormat.Version"/> is understood.</summary>
    public static bool TryReadConfiguration(ReadOnlySpan<byte> body, out ConfigurationBody configuration)
    {
        var r = new BodyReader(body);
        configuration = null!;
        int version = r.ReadByte();
        if (version != LogFormat.Version)
        {
            return false;
        }

        int major = r.ReadByte();
        int minor = r.ReadByte();
        int patch = r.ReadByte();
        long runNumber = r.ReadVarint();
        long opened = r.ReadVarint();
        long origin = r.ReadVarint();
        byte flags = r.ReadByte();
        bool second = (flags & LogFormat.ConfigFlagSecondChannel) != 0;
        int ppr = r.ReadVarint(1, int.MaxValue);
        long circumference = r.ReadVarint();
        int secondPpr = second ? r.ReadVarint(1, int.MaxValue) : 0;
        long secondCircumference = second ? r.ReadVarint() : 0;
        long rollout = r.ReadVarint();
        long rate = r.ReadVarint();
        long fullScale = r.ReadVarint();
        int forwardAxis = r.ReadByte();
        int forwardSign = r.ReadByte();
        long preTrigger = r.ReadVarint();
        long stageHold = r.ReadVarint();
        long stillBand = r.ReadVarint();
        long threshold = r.ReadVarint();
        long confirm = r.ReadVarint();
        long stopHold = r.ReadVarint();
        long bracketLimit = r.ReadVarint();

        // Appended later (LOG-FORMAT.md, 0x01): a body that ends before it was written without it.
        long stillBlock = r.Remaining > 0 && !r.Failed ? r.ReadVarint() : 0;
        if (r.Failed || forwardAxis > 2 || forwardSign > 1 || circumference < 1 || (second && secondCircumference < 1))
        {
            return false;
        }

        configuration = new ConfigurationBody
        {
            FormatVersion = version,
            FirmwareMajor = major,
            FirmwareMinor = minor,
            FirmwarePatch = patch,
            RunNumber = runNumber,
            OpenedMicros = opened,
            OriginCount = origin,
            AccelPresent = (flags & LogFormat.ConfigFlagAccelerometer) != 0,
            SecondChannelPresent = second,
            Staged = (flags & LogFormat.ConfigFlagStaged) != 0,
            PulsesPerRevolution = ppr,
            CircumferenceMicrometres = circumference,
            SecondPulsesPerRevolution = secondPpr,
            SecondCircumferenceMicrometres = secondCircumference,
            RolloutMicrometres = rollout,
            AccelOutputDataRateMilliHz = rate,
            AccelFullScaleMilliG = fullScale,
            ForwardAxis = forwardAxis,
            ForwardAxisReversed = forwardSign == 1,
            PreTriggerSamples = preTrigger,
            StageHoldMicros = stageHold,
            StillBandMilliG = stillBand,
            MotionThresholdMilliG = threshold,
            MotionConfirmSamples = confirm,
            StopHoldMicros = stopHold,
            BracketLimitMicros = bracketLimit,
            StillBlockMicros = stillBlock,
        };
        return true;
    }

    /// <summary>Parses a pulses body, undoing its delta coding, and appends the observations
    /// (absolute µs, counts from the run's origin) to <paramref name="into"/>.</summary>
    /// <remarks>All or nothing: when the body does not parse, <paramref name="into"/> is left
    /// as it was. Counts must rise by at least one per observation and widths be at least 1 µs;
    /// a bracket may start slightly before the previous one ended (the svarint gap is negative
    /// for a polling board's overlap) but never before time 0.</remarks>
    public static bool TryReadPulses(ReadOnlySpan<byte> body, out int channel, List<PulseObservation> into)
    {
        ArgumentNullException.ThrowIfNull(into);
        using var read = new PooledBuffer<PulseMicros>(16);
        if (!TryReadPulses(body, out channel, read, read))
        {
            return false;
        }

        into.EnsureCapacity(into.Count + read.Count);
        foreach (PulseMicros p in read.Span)
        {
            into.Add(new PulseObservation { Channel = channel, Count = p.Count, LoMicros = p.LoMicros, HiMicros = p.HiMicros });
        }

        return true;
    }

    /// <summary>As the public form, appending to the buffer of the body's channel without
    /// making an object per observation. All or nothing, as there.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static bool TryReadPulses(ReadOnlySpan<byte> body, out int channel, PooledBuffer<PulseMicros> channel0, PooledBuffer<PulseMicros> channel1)
    {
        var r = new BodyReader(body);
        channel = r.ReadByte();

        // Each observation takes at least three bytes, which bounds n before anything is read.
        int n = r.ReadVarint(1, Math.Max(1, r.Remaining / 3));
        if (r.Failed || channel > 1)
        {
            return false;
        }

        PooledBuffer<PulseMicros> into = channel == 0 ? channel0 : channel1;
        int before = into.Count;
        Span<PulseMicros> room = into.Append(n);
        long count = r.ReadVarint();
        long lo = r.ReadVarint();
        long width = r.ReadVarint();
        long hi = lo + width;
        if (count < 1 || width < 1 || hi > BodyReader.MaxFieldValue)
        {
            r.Reject();
        }

        room[0] = new PulseMicros(count, lo, hi);
        for (int k = 1; k < room.Length && !r.Failed; k++)
        {
            long step = r.ReadVarint();
            long gap = r.ReadSignedVarint();
            width = r.ReadVarint();
            count += step;
            lo = hi + gap;
            hi = lo + width;
            if (step < 1 || lo < 0 || lo > BodyReader.MaxFieldValue || count > BodyReader.MaxFieldValue || width < 1 || hi > BodyReader.MaxFieldValue)
            {
                r.Reject();
            }

            room[k] = new PulseMicros(count, lo, hi);
        }

        if (r.Failed || r.Remaining != 0)
        {
            into.Truncate(before);
            return false;
        }

        return true;
    }

    /// <summary>Parses an acceleration body; the samples stay in <paramref name="body"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static bool TryReadAcceleration(ReadOnlySpan<byte> body, out AccelerationBody acceleration)
    {
        var r = new BodyReader(body);
        long readMicros = r.ReadVarint();
        long firstIndex = r.ReadVarint();
        int n = r.ReadVarint(1, int.MaxValue / AccelerationBody.BytesPerSample);
        ReadOnlySpan<byte> samples = r.ReadBytes(n * AccelerationBody.BytesPerSample);
        if (r.Failed || r.Remaining != 0 || firstIndex + n > BodyReader.MaxFieldValue)
        {
            acceleration = default;
            return false;
        }

        acceleration = new AccelerationBody(readMicros, firstIndex, samples);
        return true;
    }

    /// <summary>Parses an event body with its kind's extra fields.</summary>
    public static bool TryReadEvent(ReadOnlySpan<byte> body, out EventBody evt)
    {
        var r = new BodyReader(body);
        var kind = (EventKind)r.ReadByte();
        long time = r.ReadVarint();
        long[] values = kind switch
        {
            EventKind.Staged => [r.ReadSignedVarint(), r.ReadSignedVarint(), r.ReadSignedVarint(), r.ReadVarint()],
            EventKind.Motion => [r.ReadByte()],
            EventKind.Rollout => [r.ReadVarint()],
            EventKind.AccelGap => [r.ReadVarint()],
            EventKind.BrakeOn or EventKind.BrakeOff when r.Remaining > 0 => [r.ReadVarint()],
            _ => [],
        };
        if (r.Failed)
        {
            evt = null!;
            return false;
        }

        evt = new EventBody(kind, time, values);
        return true;
    }

    /// <summary>Parses a health body, keeping the counters this reader knows.</summary>
    public static bool TryReadHealth(ReadOnlySpan<byte> body, out HealthBody health)
    {
        var r = new BodyReader(body);
        long time = r.ReadVarint();
        int m = r.ReadVarint(0, r.Remaining);
        var counters = new long[Math.Min(m, LogFormat.HealthCounterCount)];
        for (int i = 0; i < m; i++)
        {
            long value = r.ReadVarint();
            if (i < counters.Length)
            {
                counters[i] = value;
            }
        }

        if (r.Failed)
        {
            health = null!;
            return false;
        }

        health = new HealthBody(time, counters);
        return true;
    }

    /// <summary>Parses a bench-rest body (frame 0x09).</summary>
    public static bool TryReadBenchRest(ReadOnlySpan<byte> body, out BenchRestBody rest)
    {
        var r = new BodyReader(body);
        long number = r.ReadVarint();
        long opened = r.ReadVarint();
        long length = r.ReadVarint();
        long rate = r.ReadVarint();
        long fullScale = r.ReadVarint();
        int forwardAxis = r.ReadByte();
        int forwardSign = r.ReadByte();
        if (r.Failed || forwardAxis > 2 || forwardSign > 1 || rate < 1)
        {
            rest = null!;
            return false;
        }

        rest = new BenchRestBody(number, opened, length, rate, fullScale, forwardAxis, forwardSign == 1);
        return true;
    }

    /// <summary>Parses a bench-rest end body (frame 0x0A).</summary>
    public static bool TryReadBenchRestEnd(ReadOnlySpan<byte> body, out BenchRestEndBody end)
    {
        var r = new BodyReader(body);
        long number = r.ReadVarint();
        long ended = r.ReadVarint();
        int outcome = r.ReadByte();
        long samples = r.ReadVarint();
        long lost = r.ReadVarint();
        long frames = r.ReadVarint();
        if (r.Failed)
        {
            end = null!;
            return false;
        }

        end = new BenchRestEndBody(number, ended, outcome, samples, lost, frames);
        return true;
    }

    /// <summary>Parses a summary body.</summary>
    public static bool TryReadSummary(ReadOnlySpan<byte> body, out SummaryBody summary)
    {
        var r = new BodyReader(body);
        long runNumber = r.ReadVarint();
        long opened = r.ReadVarint();
        long motion = r.ReadVarint();
        long rollout = r.ReadVarint();
        long stopped = r.ReadVarint();
        long count0 = r.ReadVarint();
        long count1 = r.ReadVarint();
        long observations = r.ReadVarint();
        long samples = r.ReadVarint();
        long frames = r.ReadVarint();
        byte flags = r.ReadByte();
        if (r.Failed)
        {
            summary = null!;
            return false;
        }

        summary = new SummaryBody
        {
            RunNumber = runNumber,
            OpenedMicros = opened,
            MotionMicros = motion,
            RolloutMicros = rollout,
            StoppedMicros = stopped,
            Channel0Count = count0,
            Channel1Count = count1,
            ObservationsWritten = observations,
            AccelSamplesWritten = samples,
            FramesWritten = frames,
            Staged = (flags & LogFormat.SummaryFlagStaged) != 0,
            RolloutReached = (flags & LogFormat.SummaryFlagRolloutReached) != 0,
            ClosedByStop = (flags & LogFormat.SummaryFlagClosedByStop) != 0,
        };
        return true;
    }
}
