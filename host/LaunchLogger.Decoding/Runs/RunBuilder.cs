using System.Globalization;
using System.Runtime.CompilerServices;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Collects the frames of one run as the log gives them, then turns them into a
/// <see cref="DecodedRun"/> in SI units with accelerometer times and warnings.</summary>
/// <remarks>Collecting is cheap and in log order: pulse and acceleration bodies are only kept
/// (<see cref="RawFrames"/>); <see cref="Build"/> parses them and does the rest, and depends on
/// nothing but this run, so it may run on another thread once the run has closed.</remarks>
internal sealed class RunBuilder
{
    private readonly RawFrames raw = new();
    private readonly List<EventBody> events = [];
    private RunScratch scratch = null!;
    private readonly List<string> warnings = [];

    // The run's time bounds (InputLimits): observations outside them cannot belong to the run
    // and are dropped, so that nothing downstream is sized from a wild time under a good CRC.
    private readonly long earliestMicros;
    private readonly long latestMicros;
    private long eventsOutOfBounds;
    private long accelFramesOutOfBounds;

    /// <summary>Opens a run.</summary>
    public RunBuilder(ConfigurationBody configuration, string source)
    {
        Configuration = configuration;
        earliestMicros = configuration.OpenedMicros - (long)(InputLimits.MaxPreRunS * 1e6);
        latestMicros = configuration.OpenedMicros + (long)(InputLimits.MaxRunSpanS * 1e6);
        Source = source;
        Frames = 1;
    }

    public ConfigurationBody Configuration { get; }

    public string Source { get; }

    /// <summary>Good frames of this run, the configuration included.</summary>
    public long Frames { get; set; }

    public long CrcErrors { get; set; }

    public long MalformedFrames { get; set; }

    public long FramesLost { get; set; }

    public long CorruptBodies { get; set; }

    /// <summary>Pulse and acceleration bodies that did not parse when the run was built (also in
    /// <see cref="CorruptBodies"/>): the log's count of corrupt bodies takes them in then.</summary>
    public long CorruptBodiesAtBuild { get; private set; }

    public long UnknownFrames { get; set; }

    public HealthBody? FirstHealth { get; private set; }

    public HealthBody? LastHealth { get; private set; }

    public SummaryBody? Summary { get; set; }

    /// <summary>Keeps a pulses or acceleration body, parsed when the run is built.</summary>
    public void Keep(FrameType type, ReadOnlySpan<byte> body) => raw.Add(type, body);

    /// <summary>Bytes of pulse and acceleration bodies kept for the build: the size of the run as
    /// the reader holds it before it is built (<see cref="RunPipeline"/> bounds its read-ahead by it).</summary>
    public long KeptBytes => raw.KeptBytes;

    /// <summary>Parses the kept bodies into <see cref="scratch"/>, in log order; counts those
    /// that do not parse.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void ParseKept()
    {
        RawFrames.Reader kept = raw.Read();
        while (kept.TryNext(out FrameType type, out ReadOnlySpan<byte> body))
        {
            bool parsed;
            if (type == FrameType.Pulses)
            {
                parsed = FrameBodies.TryReadPulses(body, out _, scratch.Channel0, scratch.Channel1);
            }
            else
            {
                parsed = FrameBodies.TryReadAcceleration(body, out AccelerationBody accel);
                if (parsed)
                {
                    // The samples end the body; they are read where they were kept.
                    AddAcceleration(accel, kept.Chunk, kept.BodyOffset + body.Length - accel.Samples.Length);
                }
            }

            if (!parsed)
            {
                CorruptBodiesAtBuild++;
                CorruptBodies++;
            }
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void AddAcceleration(in AccelerationBody body, int chunk, int byteOffset)
    {
        if (!InBounds(body.ReadMicros) || body.FirstIndex > MaxSampleIndex)
        {
            accelFramesOutOfBounds++;
            return;
        }

        if ((long)(AccelSampleCount + body.Count) * AccelerationBody.BytesPerSample > Array.MaxLength)
        {
            // The samples kept must fit one array (as when they were collected into one).
            throw new OutOfMemoryException("a run holds more values than an array can");
        }

        scratch.AccelFrames.Add(new RunScratch.AccelFrame(body.ReadMicros, body.FirstIndex, body.Count, chunk, byteOffset));
        AccelSampleCount += body.Count;
    }

    public void AddEvent(EventBody evt)
    {
        if (InBounds(evt.TimeMicros))
        {
            events.Add(evt);
        }
        else
        {
            eventsOutOfBounds++;
        }
    }

    public void AddHealth(HealthBody health)
    {
        FirstHealth ??= health;
        LastHealth = health;
    }

    public void Warn(string message) => warnings.Add(message);

    /// <summary>Gives back the kept bodies of a run that will not be built.</summary>
    public void Abandon() => raw.Dispose();

    /// <summary>Builds the run, once, and gives back the kept bodies.</summary>
    /// <param name="healthBaseline">Counters to difference the run's last health frame against
    /// (null: from zero, for the first run after power-up).</param>
    /// <param name="workspace">Buffers to parse into, emptied first, this build's alone until it returns.</param>
    public DecodedRun Build(long[]? healthBaseline, RunScratch workspace)
    {
        scratch = workspace;
        scratch.Clear();
        try
        {
            ParseKept();
            return BuildParsed(healthBaseline);
        }
        finally
        {
            raw.Dispose();
            scratch = null!;
        }
    }

    private DecodedRun BuildParsed(long[]? healthBaseline)
    {
        ConfigurationBody c = Configuration;
        var configuration = new RunConfiguration
        {
            FormatVersion = c.FormatVersion,
            FirmwareVersion = string.Create(CultureInfo.InvariantCulture, $"{c.FirmwareMajor}.{c.FirmwareMinor}.{c.FirmwarePatch}"),
            RunNumber = (int)Math.Min(c.RunNumber, int.MaxValue),
            OpenedS = LogUnits.Seconds(c.OpenedMicros),
            Staged = c.Staged,
            PulsesPerRevolution = c.PulsesPerRevolution,
            CircumferenceM = LogUnits.Metres(c.CircumferenceMicrometres),
            MetresPerPulse = LogUnits.Metres(c.CircumferenceMicrometres) / c.PulsesPerRevolution,
            HasSecondChannel = c.SecondChannelPresent,
            SecondMetresPerPulse = c.SecondChannelPresent ? LogUnits.Metres(c.SecondCircumferenceMicrometres) / c.SecondPulsesPerRevolution : 0,
            SecondPulsesPerRevolution = c.SecondChannelPresent ? c.SecondPulsesPerRevolution : 0,
            RolloutM = LogUnits.Metres(c.RolloutMicrometres),
            HasAccelerometer = c.AccelPresent,
            AccelNominalRateHz = c.AccelOutputDataRateMilliHz / 1000.0,
            AccelFullScaleMps2 = LogUnits.Mps2(c.AccelFullScaleMilliG),
            ForwardAxis = c.ForwardAxis,
            ForwardAxisReversed = c.ForwardAxisReversed,
            StopHoldS = LogUnits.Seconds(c.StopHoldMicros),
            BracketLimitS = LogUnits.Seconds(c.BracketLimitMicros),
        };

        WarnDamage();
        var wide = new WideBrackets(Configuration.BracketLimitMicros);
        IReadOnlyList<PulseRecord> channel0 = PulseRecords(0, ref wide);
        IReadOnlyList<PulseRecord> channel1 = PulseRecords(1, ref wide);
        WarnWideBrackets(wide);
        var runEvents = events
            .Select(e => new RunEvent(e.Kind, LogUnits.Seconds(e.TimeMicros), e.Values))
            .OrderBy(e => e.TimeS)
            .ToList();
        EventBody? staged = events.FirstOrDefault(e => e.Kind == EventKind.Staged && e.Values.Length == 4 && e.Values[3] > 0);
        (double X, double Y, double Z)? rest = staged == null ? null : (staged.Values[0], staged.Values[1], staged.Values[2]);
        foreach (EventBody gap in events.Where(e => e.Kind == EventKind.AccelGap))
        {
            Warn(Invariant($"the accelerometer's FIFO overflowed before {LogUnits.Seconds(gap.TimeMicros):F3} s: about {gap.Values[0]} samples lost"));
        }

        AccelSeries? accel = BuildAccel(rest);
        CheckAgainstSummary();
        IReadOnlyDictionary<string, long> health = DifferenceHealth(healthBaseline);
        return new DecodedRun
        {
            Source = Source,
            Configuration = configuration,
            Pulses = channel0,
            SecondPulses = channel1,
            Accel = accel,
            Events = runEvents,
            RestGravityMilliG = rest,
            FirmwareMotionS = FirmwareTime(EventKind.Motion, Summary?.MotionMicros ?? 0),
            FirmwareRolloutS = FirmwareTime(EventKind.Rollout, Summary?.RolloutMicros ?? 0),
            Health = health,
            Complete = Summary != null,
            FramesLost = FramesLost,
            Warnings = warnings.ToList(),
        };
    }

    /// <summary>The highest sample index a run can reach: the longest run at the fastest rate,
    /// with room for a sensor that has been running since long before the run.</summary>
    private const long MaxSampleIndex = 1L << 40;

    /// <summary>Accelerometer samples read so far.</summary>
    private int AccelSampleCount { get; set; }

    private bool InBounds(long micros) => micros >= earliestMicros && micros <= latestMicros;

    private void WarnDamage()
    {
        if (eventsOutOfBounds + accelFramesOutOfBounds > 0)
        {
            Warn(Invariant($"{eventsOutOfBounds} event(s) and {accelFramesOutOfBounds} accelerometer frame(s) lay outside the run's time bounds ({InputLimits.MaxPreRunS} s before its opening to {InputLimits.MaxRunSpanS} s after) and were dropped"));
        }

        if (FramesLost > 0)
        {
            Warn(Invariant($"{FramesLost} frame(s) lost inside this run (gaps in the sequence numbers)"));
        }

        if (CrcErrors > 0)
        {
            Warn(Invariant($"{CrcErrors} frame(s) failed their CRC inside this run and were skipped"));
        }

        if (MalformedFrames > 0)
        {
            Warn(Invariant($"{MalformedFrames} damaged frame(s) (bad stuffing or size) inside this run were skipped"));
        }

        if (CorruptBodies > 0)
        {
            Warn(Invariant($"{CorruptBodies} frame(s) with a good CRC but an unreadable body were skipped"));
        }

        if (UnknownFrames > 0)
        {
            Warn(Invariant($"{UnknownFrames} frame(s) of a type this reader does not know were skipped"));
        }
    }

    /// <summary>The channel's observations in seconds, dropping any that repeat or go back on an
    /// earlier count, packed 12 bytes each (<see cref="PackedPulses"/>) when every value fits,
    /// else in an array of exactly their number; counts the wide brackets into <paramref name="wide"/>.</summary>
    /// <remarks>One pass into an array of the observations' number, written before it is seen
    /// (so the allocator need not clear it).</remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private IReadOnlyList<PulseRecord> PulseRecords(int channel, ref WideBrackets wide)
    {
        ReadOnlySpan<PulseMicros> observed = (channel == 0 ? scratch.Channel0 : scratch.Channel1).Span;
        if (observed.Length == 0)
        {
            return [];
        }

        var filter = NewPulseFilter(channel);
        WideBrackets wideHere = wide;
        var packed = new RecordChunks<uint>(PackedPulses.RecordLength, observed.Length);
        bool fits = latestMicros - earliestMicros <= uint.MaxValue;
        long baseCount = 0;
        int kept = 0;

        // Written a chunk at a time: the chunk being filled and the next place in it.
        int chunk = 0;
        Span<uint> into = packed.Chunk(0);
        int at = 0;
        foreach (ref readonly PulseMicros p in observed)
        {
            if (!fits || !filter.Keep(p))
            {
                continue;
            }

            if (kept == 0)
            {
                baseCount = p.Count;
            }

            if (p.Count - baseCount > uint.MaxValue)
            {
                fits = false;
                continue;
            }

            if (at == into.Length)
            {
                into = packed.Chunk(++chunk);
                at = 0;
            }

            into[at] = (uint)(p.Count - baseCount);
            into[at + 1] = (uint)(p.LoMicros - earliestMicros);
            into[at + 2] = (uint)(p.HiMicros - earliestMicros);
            at += PackedPulses.RecordLength;
            kept++;
            wideHere.Count(p.LoMicros, p.HiMicros);
        }

        IReadOnlyList<PulseRecord> records;
        if (fits)
        {
            packed.Shrink(kept);
            records = new PackedPulses(packed, baseCount, earliestMicros);
            wide = wideHere;
        }
        else
        {
            packed.Discard();
            filter = NewPulseFilter(channel);
            records = PulseArray(observed, ref filter, ref wide, out kept);
        }

        WarnFiltered(channel, observed.Length, kept, filter);
        return records;
    }

    /// <summary>As <see cref="PulseRecords"/>, into an array of <see cref="PulseRecord"/>, for
    /// observations whose values do not all fit the packed form.</summary>
    private static PulseRecord[] PulseArray(ReadOnlySpan<PulseMicros> observed, ref PulseFilter filter, ref WideBrackets wide, out int kept)
    {
        PulseRecord[] records = GC.AllocateUninitializedArray<PulseRecord>(observed.Length);
        kept = 0;
        foreach (ref readonly PulseMicros p in observed)
        {
            if (filter.Keep(p))
            {
                var record = new PulseRecord(p.Count, LogUnits.Seconds(p.LoMicros), LogUnits.Seconds(p.HiMicros));
                wide.Count(p.LoMicros, p.HiMicros);
                records[kept++] = record;
            }
        }

        if (kept < records.Length)
        {
            Array.Resize(ref records, kept);
        }

        return records;
    }

    private PulseFilter NewPulseFilter(int channel) =>
        new(MaxCount(channel), InputLimits.MaxPlausibleSpeedMps / 1e6 / MetresPerPulse(channel), earliestMicros, latestMicros);

    private void WarnFiltered(int channel, int observed, int kept, in PulseFilter filter)
    {
        int outOfBounds = filter.OutOfBounds;
        int tooFast = filter.TooFast;
        if (outOfBounds > 0)
        {
            Warn(Invariant($"{outOfBounds} pulse observation(s) of channel {channel} lay outside the run's bounds ({InputLimits.MaxPreRunS} s before its opening to {InputLimits.MaxRunSpanS} s after) and were dropped"));
        }

        if (tooFast > 0)
        {
            Warn(Invariant($"{tooFast} pulse observation(s) of channel {channel} counted faster than {InputLimits.MaxPlausibleSpeedMps} m/s since the one before and were dropped"));
        }

        int dropped = observed - kept - outOfBounds - tooFast;
        if (dropped > 0)
        {
            Warn(Invariant($"{dropped} pulse observation(s) of channel {channel} repeated or went back on an earlier count and were dropped"));
        }
    }

    /// <summary>Brackets wider than the configured limit: how many and the widest, seconds.</summary>
    /// <remarks>A bracket is wide when its width in seconds (each end turned into seconds, as
    /// its <see cref="PulseRecord"/> holds it) exceeds the limit. One whole microsecond narrower
    /// than the limit is far more than that rounding, so only brackets at least as wide as the
    /// limit in µs are turned into seconds.</remarks>
    private struct WideBrackets(long limitMicros)
    {
        public readonly double LimitS = LogUnits.Seconds(limitMicros);

        public int Wide;

        public double Widest;

        public void Count(long loMicros, long hiMicros)
        {
            if (hiMicros - loMicros < limitMicros || !(LimitS > 0))
            {
                return;
            }

            double widthS = LogUnits.Seconds(hiMicros) - LogUnits.Seconds(loMicros);
            if (widthS > LimitS)
            {
                Wide++;
                Widest = Math.Max(Widest, widthS);
            }
        }
    }

    /// <summary>The distance per pulse of a channel, m.</summary>
    private double MetresPerPulse(int channel)
    {
        ConfigurationBody c = Configuration;
        double metresPerPulse = channel == 0
            ? c.CircumferenceMicrometres / 1e6 / c.PulsesPerRevolution
            : c.SecondPulsesPerRevolution > 0 ? c.SecondCircumferenceMicrometres / 1e6 / c.SecondPulsesPerRevolution : 0;
        return Math.Max(metresPerPulse, InputLimits.MinMetresPerPulse);
    }

    /// <summary>The most pulses a channel can count in the longest run at the highest plausible speed.</summary>
    private long MaxCount(int channel) =>
        (long)Math.Min(long.MaxValue / 2.0, InputLimits.MaxRunSpanS * InputLimits.MaxPlausibleSpeedMps / MetresPerPulse(channel)) + 1;

    /// <summary>Keeps the observations of one channel that move the count forward, lie within the
    /// run's time bounds and imply no speed above <see cref="InputLimits.MaxPlausibleSpeedMps"/>
    /// since the last one kept; counts the rest by cause.</summary>
    private struct PulseFilter(long maxCount, double maxPulsesPerMicro, long earliestMicros, long latestMicros)
    {
        private long lastCount;
        private long lastLo = long.MinValue;

        public int OutOfBounds { get; private set; }

        public int TooFast { get; private set; }

        public bool Keep(in PulseMicros p)
        {
            if (p.LoMicros > p.HiMicros || p.LoMicros < earliestMicros || p.HiMicros > latestMicros || p.Count > maxCount)
            {
                OutOfBounds++;
                return false;
            }

            if (p.Count <= lastCount)
            {
                return false;
            }

            // One pulse more is always possible; a jump of many needs the time to cover them.
            long step = p.Count - lastCount;
            long since = p.HiMicros - Math.Max(lastLo, earliestMicros);
            if (step > 1 && step > (Math.Max(0, since) * maxPulsesPerMicro) + 1)
            {
                TooFast++;
                return false;
            }

            lastCount = p.Count;
            lastLo = p.LoMicros;
            return true;
        }
    }

    private void WarnWideBrackets(in WideBrackets wide)
    {
        if (wide.Wide > 0)
        {
            Warn(Invariant($"{wide.Wide} pulse observation(s) have brackets wider than the {wide.LimitS * 1000:0.###} ms limit (widest {wide.Widest * 1000:0.###} ms): edge times are uncertain there"));
        }
    }

    private double? FirmwareTime(EventKind kind, long summaryMicros)
    {
        EventBody? evt = events.FirstOrDefault(e => e.Kind == kind);
        if (evt != null)
        {
            return LogUnits.Seconds(evt.TimeMicros);
        }

        return summaryMicros > 0 ? LogUnits.Seconds(summaryMicros) : null;
    }

    private AccelSeries? BuildAccel((double X, double Y, double Z)? rest)
    {
        ReadOnlySpan<RunScratch.AccelFrame> frames = scratch.AccelFrames.Span;
        if (frames.Length == 0)
        {
            return null;
        }

        FillBursts();
        ReadOnlySpan<BurstReading> bursts = scratch.Bursts.Span;
        double nominalPeriodS = Configuration.AccelOutputDataRateMilliHz > 0
            ? 1000.0 / Configuration.AccelOutputDataRateMilliHz
            : FallbackPeriod(bursts);
        if (!(nominalPeriodS > 0))
        {
            Warn("accelerometer samples were dropped: no configured rate and too little data to time them");
            return null;
        }

        SampleClock clock = SampleClock.Fit(bursts, nominalPeriodS);
        if (!clock.Estimated)
        {
            Warn(Invariant($"too few accelerometer bursts to measure the sample period; the nominal {1 / nominalPeriodS:0.###} Hz is used (±{SampleClock.NominalRelativeUncertainty:P0})"));
        }
        else if (Configuration.AccelOutputDataRateMilliHz > 0 && Math.Abs((clock.PeriodS / nominalPeriodS) - 1) > 0.02)
        {
            Warn(Invariant($"the accelerometer ran at {1 / clock.PeriodS:0.###} Hz against a nominal {1 / nominalPeriodS:0.###} Hz: check its configuration"));
        }

        AxisMapping axes = AxisMapping.Choose(Configuration.ForwardAxis, Configuration.ForwardAxisReversed, rest);
        if (rest is { } g)
        {
            double[] v = [g.X, g.Y, g.Z];
            if (Math.Abs(v[axes.ForwardAxis]) > Math.Abs(v[axes.VerticalAxis]))
            {
                Warn("the configured forward axis carries more resting gravity than the vertical one: check the forward axis setting");
            }
        }

        PackedAccelSamples packed = PackSamples(frames, clock, axes);
        if (packed.Count < AccelSampleCount)
        {
            Warn(Invariant($"{AccelSampleCount - packed.Count} accelerometer sample(s) repeated or out of order were dropped"));
        }

        return new AccelSeries(packed)
        {
            HasAllAxes = true,
            SamplePeriodS = clock.PeriodS,
            SamplePeriodUncertaintyS = clock.PeriodSigmaS,
            Axes = axes,
        };
    }

    /// <summary>Keeps the samples whose index and time move forward and lie within the run's
    /// bounds, as written (6 bytes each), with the stretches of unbroken numbering they form.</summary>
    /// <remarks>Times are computed as <see cref="SampleClock.TimeOf"/> does, with the segment's
    /// origin looked up once per frame; kept samples are copied a stretch at a time.</remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private PackedAccelSamples PackSamples(ReadOnlySpan<RunScratch.AccelFrame> frames, SampleClock clock, AxisMapping axes)
    {
        ReadOnlySpan<BurstReading> bursts = scratch.Bursts.Span;
        ReadOnlySpan<int> burstOfFrame = scratch.BurstOfFrame.Span;
        var stretches = new StretchList(frames.Length);
        var kept = new RecordChunks<byte>(AccelerationBody.BytesPerSample, AccelSampleCount);
        double periodS = clock.PeriodS;
        double earliestS = LogUnits.Seconds(earliestMicros);
        double latestS = LogUnits.Seconds(latestMicros);
        int keptCount = 0;
        long lastIndex = long.MinValue;
        double lastTime = double.NegativeInfinity;
        for (int f = 0; f < frames.Length; f++)
        {
            RunScratch.AccelFrame frame = frames[f];
            double originS = clock.OriginS(bursts[burstOfFrame[f]].Segment);
            if (WholeFrameKept(frame, originS, periodS, lastIndex, lastTime, earliestS, latestS, out double frameLastTime))
            {
                stretches.Add(keptCount, frame.FirstIndex, originS);
                keptCount = Copy(raw, frame, 0, frame.Count, kept, keptCount);
                lastIndex = frame.FirstIndex + frame.Count - 1;
                lastTime = frameLastTime;
                continue;
            }

            int runFrom = -1;
            for (int i = 0; i < frame.Count; i++)
            {
                long sampleIndex = frame.FirstIndex + i;
                double t = originS + (periodS * sampleIndex);
                if (sampleIndex <= lastIndex || !(t > lastTime) || !(t >= earliestS && t <= latestS))
                {
                    if (runFrom >= 0)
                    {
                        keptCount = Copy(raw, frame, runFrom, i, kept, keptCount);
                        runFrom = -1;
                    }

                    continue;
                }

                if (runFrom < 0)
                {
                    runFrom = i;
                    stretches.Add(keptCount, sampleIndex, originS);
                }

                lastIndex = sampleIndex;
                lastTime = t;
            }

            if (runFrom >= 0)
            {
                keptCount = Copy(raw, frame, runFrom, frame.Count, kept, keptCount);
            }
        }

        kept.Shrink(keptCount);
        return new PackedAccelSamples(kept, stretches.Starts(), stretches.FirstIndices(), stretches.Origins(), periodS, axes);

        // True when the sample-by-sample test below would keep every sample of the frame: the
        // first moves index and time forward, the first and last lie within the bounds, and
        // the period is wider than the rounding of any two neighbouring times, so that times
        // rise strictly from sample to sample (each time is origin + period × index, rounded
        // twice; the rounding moves it by at most one unit in the last place of the product and
        // of the sum, each below 2^-52 of their size).
        static bool WholeFrameKept(in RunScratch.AccelFrame frame, double originS, double periodS, long lastIndex, double lastTime, double earliestS, double latestS, out double lastS)
        {
            long first = frame.FirstIndex;
            long last = first + frame.Count - 1;
            double firstS = originS + (periodS * first);
            lastS = originS + (periodS * last);
            double largest = Math.Max(Math.Abs(firstS), Math.Abs(lastS)) + (periodS * Math.Max(Math.Abs((double)first), Math.Abs((double)last)));
            return frame.Count > 0 && first > lastIndex && firstS > lastTime && firstS >= earliestS && lastS <= latestS
                && periodS > 0 && periodS > 4 * largest / (1L << 52);
        }

        static int Copy(RawFrames samples, in RunScratch.AccelFrame frame, int from, int to, RecordChunks<byte> into, int at)
        {
            const int size = AccelerationBody.BytesPerSample;
            into.Write(at, samples.Bytes(frame.Chunk, frame.ByteOffset + (from * size), (to - from) * size));
            return at + to - from;
        }
    }

    /// <summary>The stretches of kept samples with unbroken numbering: where each starts among
    /// the kept samples, its first sample's index and its clock origin. A new stretch starts at
    /// each frame (the next frame's numbering need not follow on).</summary>
    private sealed class StretchList(int capacity)
    {
        private int[] starts = new int[Math.Max(capacity, 1)];
        private long[] firstIndices = new long[Math.Max(capacity, 1)];
        private double[] origins = new double[Math.Max(capacity, 1)];
        private int count;

        public void Add(int start, long firstIndex, double originS)
        {
            if (count > 0 && origins[count - 1] == originS && firstIndices[count - 1] + (start - starts[count - 1]) == firstIndex)
            {
                // Follows on from the last stretch on the same origin: one stretch.
                return;
            }

            if (count == starts.Length)
            {
                Array.Resize(ref starts, 2 * count);
                Array.Resize(ref firstIndices, 2 * count);
                Array.Resize(ref origins, 2 * count);
            }

            starts[count] = start;
            firstIndices[count] = firstIndex;
            origins[count] = originS;
            count++;
        }

        public int[] Starts() => starts[..count];

        public long[] FirstIndices() => firstIndices[..count];

        public double[] Origins() => origins[..count];
    }

    /// <summary>One reading per burst: consecutive frames that share a read time are parts of
    /// one burst, whose newest sample is the highest index among them (LOG-FORMAT.md, 0x03).
    /// A new segment starts where the numbering does not follow on, or after a FIFO overflow.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void FillBursts()
    {
        ReadOnlySpan<RunScratch.AccelFrame> frames = scratch.AccelFrames.Span;
        PooledBuffer<BurstReading> bursts = scratch.Bursts;
        bursts.Clear();
        scratch.BurstOfFrame.Clear();
        Span<int> burstOfFrame = scratch.BurstOfFrame.Append(frames.Length);
        long[] gaps = GapTimes();
        int segment = 0;
        long previousRead = long.MinValue;
        long previousLast = long.MinValue;
        for (int f = 0; f < frames.Length; f++)
        {
            RunScratch.AccelFrame frame = frames[f];
            long last = frame.FirstIndex + frame.Count - 1;
            if (bursts.Count > 0 && frame.ReadMicros == previousRead)
            {
                ref BurstReading current = ref bursts[bursts.Count - 1];
                current = current with { LastIndex = Math.Max(current.LastIndex, last) };
            }
            else
            {
                if (bursts.Count > 0
                    && (frame.FirstIndex != previousLast + 1 || AnyGapIn(gaps, previousRead, frame.ReadMicros)))
                {
                    segment++;
                }

                bursts.Add(new BurstReading(last, LogUnits.Seconds(frame.ReadMicros), segment));
            }

            burstOfFrame[f] = bursts.Count - 1;
            previousRead = frame.ReadMicros;
            previousLast = Math.Max(previousLast, last);
        }
    }

    /// <summary>The times of the run's FIFO-overflow events, ascending.</summary>
    private long[] GapTimes()
    {
        int count = 0;
        foreach (EventBody e in events)
        {
            count += e.Kind == EventKind.AccelGap ? 1 : 0;
        }

        if (count == 0)
        {
            return [];
        }

        var gaps = new long[count];
        count = 0;
        foreach (EventBody e in events)
        {
            if (e.Kind == EventKind.AccelGap)
            {
                gaps[count++] = e.TimeMicros;
            }
        }

        Array.Sort(gaps);
        return gaps;
    }

    /// <summary>True when a gap time t has <paramref name="afterMicros"/> &lt; t ≤ <paramref name="untilMicros"/>.</summary>
    private static bool AnyGapIn(long[] sortedGaps, long afterMicros, long untilMicros)
    {
        if (sortedGaps.Length == 0)
        {
            return false;
        }

        // The first gap later than afterMicros: is it at or before untilMicros?
        int at = Array.BinarySearch(sortedGaps, afterMicros);
        at = at < 0 ? ~at : at;
        while (at < sortedGaps.Length && sortedGaps[at] <= afterMicros)
        {
            at++;
        }

        return at < sortedGaps.Length && sortedGaps[at] <= untilMicros;
    }

    /// <summary>Read-time span over index span, for a log without a configured rate.</summary>
    private static double FallbackPeriod(ReadOnlySpan<BurstReading> bursts)
    {
        BurstReading first = bursts[0];
        BurstReading last = bursts[^1];
        return last.LastIndex > first.LastIndex ? (last.ReadS - first.ReadS) / (last.LastIndex - first.LastIndex) : 0;
    }

    private void CheckAgainstSummary()
    {
        if (Summary is not { } s)
        {
            return;
        }

        if (s.RunNumber != Configuration.RunNumber || s.OpenedMicros != Configuration.OpenedMicros)
        {
            Warn(Invariant($"the summary names run {s.RunNumber} opened at {LogUnits.Seconds(s.OpenedMicros):F6} s but the configuration run {Configuration.RunNumber} at {LogUnits.Seconds(Configuration.OpenedMicros):F6} s"));
        }

        CompareCount("pulse observations", s.ObservationsWritten, scratch.Channel0.Count + scratch.Channel1.Count);
        CompareCount("accelerometer samples", s.AccelSamplesWritten, AccelSampleCount);
        CompareCount("frames", s.FramesWritten, Frames);
    }

    private void CompareCount(string what, long written, long read)
    {
        if (read < written)
        {
            Warn(Invariant($"{written - read} of the {written} {what} the summary counts are missing"));
        }
        else if (read > written)
        {
            Warn(Invariant($"{read} {what} read but the summary counts only {written}"));
        }
    }

    private Dictionary<string, long> DifferenceHealth(long[]? baseline)
    {
        var health = new Dictionary<string, long>();
        if (LastHealth == null)
        {
            return health;
        }

        long[] close = LastHealth.Counters;
        for (int i = 0; i < close.Length; i++)
        {
            bool isMaximum = i == HealthCounterNames.WidestBracketIndex;
            long before = !isMaximum && baseline != null && i < baseline.Length ? baseline[i] : 0;
            health[HealthCounterNames.InLogOrder[i]] = close[i] - before;
        }

        WarnHealth(health, HealthCounterNames.PulseObservationsDropped, "pulse observation(s) dropped by the box (capture queue full)");
        WarnHealth(health, HealthCounterNames.CountsWentBackwards, "pulse count(s) went backwards on the box (hardware fault) and were discarded");
        WarnHealth(health, HealthCounterNames.AccelReadFailures, "accelerometer read(s) failed on the box");
        WarnHealth(health, HealthCounterNames.FramesRefused, "frame(s) refused by the box's storage or serial link");
        WarnHealth(health, HealthCounterNames.AccelSamplesClipped, "accelerometer sample(s) at full scale (clipped)");
        return health;
    }

    private void WarnHealth(Dictionary<string, long> health, string name, string what)
    {
        if (health.TryGetValue(name, out long value) && value > 0)
        {
            Warn(Invariant($"{value} {what}"));
        }
    }
}
