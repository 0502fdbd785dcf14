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
        var r = new BodyReader(body);
        channel = r.ReadByte();

        // Each observation takes at least three bytes, which bounds n before anything is read.
        int n = r.ReadVarint(1, Math.Max(1, r.Remaining / 3));
        if (r.Failed || channel > 1)
        {
            return false;
        }

        int before = into.Count;
        long count = 0;
        long hi = 0;
        for (int k = 0; k < n; k++)
        {
            long lo;
            if (k == 0)
            {
                count = r.ReadVarint();
                lo = r.ReadVarint();
                if (count < 1)
                {
                    r.Reject();
                }
            }
            else
            {
                long step = r.ReadVarint();
                long gap = r.ReadSignedVarint();
                count += step;
                lo = hi + gap;
                if (step < 1 || lo < 0 || count > BodyReader.MaxFieldValue)
                {
                    r.Reject();
                }
            }

            long width = r.ReadVarint();
            hi = lo + width;
            if (width < 1 || hi > BodyReader.MaxFieldValue)
            {
                r.Reject();
            }

            if (r.Failed)
            {
                break;
            }

            into.Add(new PulseObservation { Channel = channel, Count = count, LoMicros = lo, HiMicros = hi });
        }

        if (r.Failed || r.Remaining != 0)
        {
            into.RemoveRange(before, into.Count - before);
            return false;
        }

        return true;
    }

    /// <summary>Parses an acceleration body; the samples stay in <paramref name="body"/>.</summary>
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
