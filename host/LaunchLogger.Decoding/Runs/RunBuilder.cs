using System.Globalization;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Wire;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Collects the frames of one run as the log gives them, then turns them into a
/// <see cref="DecodedRun"/> in SI units with accelerometer times and warnings.</summary>
internal sealed class RunBuilder
{
    private readonly List<PulseObservation> pulses = [];
    private readonly List<AccelFrameInfo> accelFrames = [];
    private readonly List<EventBody> events = [];
    private readonly List<string> warnings = [];
    private short[] accelValues = new short[3 * 1024];
    private int accelSampleCount;

    public RunBuilder(ConfigurationBody configuration, string source)
    {
        Configuration = configuration;
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

    public long UnknownFrames { get; set; }

    public HealthBody? FirstHealth { get; private set; }

    public HealthBody? LastHealth { get; private set; }

    public SummaryBody? Summary { get; set; }

    public List<PulseObservation> Pulses => pulses;

    public void AddAcceleration(in AccelerationBody body)
    {
        int n = body.Count;
        EnsureRoom(n);
        accelFrames.Add(new AccelFrameInfo(body.ReadMicros, body.FirstIndex, n, accelSampleCount));
        int at = accelSampleCount * 3;
        for (int i = 0; i < n; i++)
        {
            accelValues[at++] = body.MilliG(i, 0);
            accelValues[at++] = body.MilliG(i, 1);
            accelValues[at++] = body.MilliG(i, 2);
        }

        accelSampleCount += n;
    }

    public void AddEvent(EventBody evt) => events.Add(evt);

    public void AddHealth(HealthBody health)
    {
        FirstHealth ??= health;
        LastHealth = health;
    }

    public void Warn(string message) => warnings.Add(message);

    /// <summary>Builds the run.</summary>
    /// <param name="healthBaseline">Counters to difference the run's last health frame against
    /// (null: from zero, for the first run after power-up).</param>
    public DecodedRun Build(long[]? healthBaseline)
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
        List<PulseRecord> channel0 = PulseRecords(0);
        List<PulseRecord> channel1 = PulseRecords(1);
        WarnWideBrackets(channel0, channel1, configuration.BracketLimitS);
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
            Warnings = warnings.ToList(),
        };
    }

    private void EnsureRoom(int samples)
    {
        int needed = (accelSampleCount + samples) * 3;
        if (needed > accelValues.Length)
        {
            Array.Resize(ref accelValues, Math.Max(needed, accelValues.Length * 2));
        }
    }

    private void WarnDamage()
    {
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

    private List<PulseRecord> PulseRecords(int channel)
    {
        var records = new List<PulseRecord>();
        long lastCount = 0;
        int dropped = 0;
        foreach (PulseObservation p in pulses)
        {
            if (p.Channel != channel)
            {
                continue;
            }

            if (p.Count <= lastCount)
            {
                dropped++;
                continue;
            }

            records.Add(new PulseRecord(p.Count, LogUnits.Seconds(p.LoMicros), LogUnits.Seconds(p.HiMicros)));
            lastCount = p.Count;
        }

        if (dropped > 0)
        {
            Warn(Invariant($"{dropped} pulse observation(s) of channel {channel} repeated or went back on an earlier count and were dropped"));
        }

        return records;
    }

    private void WarnWideBrackets(List<PulseRecord> channel0, List<PulseRecord> channel1, double limitS)
    {
        if (!(limitS > 0))
        {
            return;
        }

        int wide = 0;
        double widest = 0;
        foreach (PulseRecord p in channel0.Concat(channel1))
        {
            if (p.WidthS > limitS)
            {
                wide++;
                widest = Math.Max(widest, p.WidthS);
            }
        }

        if (wide > 0)
        {
            Warn(Invariant($"{wide} pulse observation(s) have brackets wider than the {limitS * 1000:0.###} ms limit (widest {widest * 1000:0.###} ms): edge times are uncertain there"));
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
        if (accelFrames.Count == 0)
        {
            return null;
        }

        List<BurstReading> bursts = Bursts(out int[] burstOfFrame);
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

        int n = accelSampleCount;
        var time = new double[n];
        var index = new long[n];
        var forward = new double[n];
        var lateral = new double[n];
        var vertical = new double[n];
        int kept = 0;
        long lastIndex = long.MinValue;
        double lastTime = double.NegativeInfinity;
        for (int f = 0; f < accelFrames.Count; f++)
        {
            AccelFrameInfo frame = accelFrames[f];
            int segment = bursts[burstOfFrame[f]].Segment;
            for (int i = 0; i < frame.Count; i++)
            {
                long sampleIndex = frame.FirstIndex + i;
                double t = clock.TimeOf(sampleIndex, segment);
                if (sampleIndex <= lastIndex || !(t > lastTime))
                {
                    continue;
                }

                int at = (frame.Offset + i) * 3;
                forward[kept] = axes.ForwardSign * LogUnits.Mps2(accelValues[at + axes.ForwardAxis]);
                lateral[kept] = axes.LateralSign * LogUnits.Mps2(accelValues[at + axes.LateralAxis]);
                vertical[kept] = axes.VerticalSign * LogUnits.Mps2(accelValues[at + axes.VerticalAxis]);
                time[kept] = t;
                index[kept] = sampleIndex;
                kept++;
                lastIndex = sampleIndex;
                lastTime = t;
            }
        }

        if (kept < n)
        {
            Warn(Invariant($"{n - kept} accelerometer sample(s) repeated or out of order were dropped"));
            Array.Resize(ref time, kept);
            Array.Resize(ref index, kept);
            Array.Resize(ref forward, kept);
            Array.Resize(ref lateral, kept);
            Array.Resize(ref vertical, kept);
        }

        return new AccelSeries
        {
            TimeS = time,
            ForwardMps2 = forward,
            LateralMps2 = lateral,
            VerticalMps2 = vertical,
            HasAllAxes = true,
            SamplePeriodS = clock.PeriodS,
            SamplePeriodUncertaintyS = clock.PeriodSigmaS,
            SampleIndex = index,
            Axes = axes,
        };
    }

    /// <summary>One reading per burst: consecutive frames that share a read time are parts of
    /// one burst, whose newest sample is the highest index among them (LOG-FORMAT.md, 0x03).
    /// A new segment starts where the numbering does not follow on, or after a FIFO overflow.</summary>
    private List<BurstReading> Bursts(out int[] burstOfFrame)
    {
        var bursts = new List<BurstReading>();
        burstOfFrame = new int[accelFrames.Count];
        long[] gaps = events.Where(e => e.Kind == EventKind.AccelGap).Select(e => e.TimeMicros).ToArray();
        int segment = 0;
        long previousRead = long.MinValue;
        long previousLast = long.MinValue;
        for (int f = 0; f < accelFrames.Count; f++)
        {
            AccelFrameInfo frame = accelFrames[f];
            long last = frame.FirstIndex + frame.Count - 1;
            if (bursts.Count > 0 && frame.ReadMicros == previousRead)
            {
                BurstReading current = bursts[^1];
                bursts[^1] = current with { LastIndex = Math.Max(current.LastIndex, last) };
            }
            else
            {
                if (bursts.Count > 0
                    && (frame.FirstIndex != previousLast + 1 || gaps.Any(t => t > previousRead && t <= frame.ReadMicros)))
                {
                    segment++;
                }

                bursts.Add(new BurstReading(last, LogUnits.Seconds(frame.ReadMicros), segment));
            }

            burstOfFrame[f] = bursts.Count - 1;
            previousRead = frame.ReadMicros;
            previousLast = Math.Max(previousLast, last);
        }

        return bursts;
    }

    /// <summary>Read-time span over index span, for a log without a configured rate.</summary>
    private static double FallbackPeriod(List<BurstReading> bursts)
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

        CompareCount("pulse observations", s.ObservationsWritten, pulses.Count);
        CompareCount("accelerometer samples", s.AccelSamplesWritten, accelSampleCount);
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

    private readonly record struct AccelFrameInfo(long ReadMicros, long FirstIndex, int Count, int Offset);
}
