using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Decoding.Tests.Runs.Support;

/// <summary>Drives the real firmware core through an idealised launch — still, then constant
/// acceleration, then no more edges — and remembers exactly what it fed, for round trips.</summary>
/// <remarks>Grown from the command-line tool's scripted launch. Additions: the accelerometer's
/// true rate may differ from the nominal one, bursts may be read late by a seeded random
/// latency, pulses may be polled (brackets one poll period wide), the sensor may be mounted in
/// any orientation, a FIFO overflow and a brake switch can be scripted, and a second channel
/// can mirror the first.</remarks>
internal sealed class LaunchDriver
{
    private const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)

    public LaunchDriver(LoggerSettings settings, double accelerationMps2 = 0.5 * G0, long launchMicros = 2_000_000, long startMicros = 0)
    {
        Settings = settings;
        Sink = new MemorySink();
        Recorder = new RunRecorder(settings, Sink, Health);
        AccelerationMps2 = accelerationMps2;
        LaunchMicros = launchMicros;
        StartMicros = startMicros;
        TrueRateHz = settings.AccelOutputDataRateMilliHz / 1000.0;
    }

    private LaunchDriver(LaunchDriver previous, long launchMicros, long startMicros)
    {
        Settings = previous.Settings;
        Sink = previous.Sink;
        Health = previous.Health;
        Recorder = previous.Recorder;
        AccelerationMps2 = previous.AccelerationMps2;
        LaunchMicros = launchMicros;
        StartMicros = startMicros;
        TrueRateHz = previous.TrueRateHz;
    }

    public LoggerSettings Settings { get; }

    public MemorySink Sink { get; }

    public HealthCounters Health { get; } = new();

    public RunRecorder Recorder { get; }

    public double AccelerationMps2 { get; }

    public long LaunchMicros { get; }

    public long StartMicros { get; }

    public int BurstSamples { get; init; } = 20;

    /// <summary>The sensor's true output rate, Hz.</summary>
    public double TrueRateHz { get; init; }

    /// <summary>Largest read latency after a burst's last sample, µs (uniform, seeded).</summary>
    public int MaxReadLatencyMicros { get; init; }

    public int Seed { get; init; } = 1;

    /// <summary>0 for exact edge timestamps (1 µs brackets); otherwise the poll period, µs.</summary>
    public long PollMicros { get; init; }

    /// <summary>Sensor axis of gravity (up) and its sign.</summary>
    public int GravityAxis { get; init; } = 2;

    public int GravitySign { get; init; } = 1;

    /// <summary>When set, bursts stop at this time and resume after <see cref="OverflowLostSamples"/>
    /// samples; the index resumes with the box's estimate, off by <see cref="OverflowIndexError"/>.</summary>
    public long OverflowAtMicros { get; init; } = -1;

    public int OverflowLostSamples { get; init; }

    public int OverflowIndexError { get; init; }

    /// <summary>Brake switch closes at this time (µs), or never.</summary>
    public long BrakeOnMicros { get; init; } = -1;

    /// <summary>Channel 0 origin count (the hardware counter's value at power-up).</summary>
    public long CounterOrigin { get; init; }

    public List<PulseObservation> FedPulses { get; } = [];

    /// <summary>The last count fed, from this launch's origin.</summary>
    public long LastCount { get; private set; }

    /// <summary>Samples fed, by sensor index: raw milli-g and the true time (s).</summary>
    public Dictionary<long, (short X, short Y, short Z, double TrueS)> FedSamples { get; } = [];

    public List<(long LastIndex, long ReadMicros)> FedBursts { get; } = [];

    public double MetresPerPulse => Settings.CircumferenceMicrometres * 1e-6 / Settings.PulsesPerRevolution;

    public double TruePeriodS => 1 / TrueRateHz;

    /// <summary>Feeds the core until <paramref name="endMicros"/>, accelerating until
    /// <paramref name="accelerateUntilMicros"/>.</summary>
    public void Run(long accelerateUntilMicros, long endMicros)
    {
        var random = new Random(Seed);
        var burst = new short[BurstSamples * 3];
        Recorder.SetCounterOrigin(0, CounterOrigin);
        if (Settings.SecondChannelEnabled)
        {
            Recorder.SetCounterOrigin(1, CounterOrigin);
        }

        long nextEdge = 1;
        long lastPoll = StartMicros;
        long polledCount = 0;
        long indexOffset = 0;
        long sampleZero = (long)Math.Ceiling(StartMicros * 1e-6 / TruePeriodS);
        bool overflowDone = false;
        bool brakeDone = false;
        for (long first = sampleZero; ; first += BurstSamples)
        {
            long last = first + BurstSamples - 1;
            double lastTrueS = last * TruePeriodS;
            if (OverflowAtMicros >= 0 && !overflowDone && lastTrueS * 1e6 >= OverflowAtMicros)
            {
                // The FIFO overflows: these samples and the next few are lost; the box notices at
                // the next read and guesses the count from the elapsed time.
                overflowDone = true;
                first += OverflowLostSamples - BurstSamples;
                indexOffset = OverflowIndexError;
                long noticed = (long)Math.Round((first + BurstSamples - 1) * TruePeriodS * 1e6);
                Recorder.OnAccelGap(OverflowLostSamples + OverflowIndexError, noticed);
                continue;
            }

            long readMicros = (long)Math.Round(lastTrueS * 1e6) + (MaxReadLatencyMicros > 0 ? random.Next(MaxReadLatencyMicros + 1) : 0);
            if (readMicros > endMicros)
            {
                break;
            }

            FeedPulsesUntil(readMicros, accelerateUntilMicros, ref nextEdge, ref lastPoll, ref polledCount);
            if (BrakeOnMicros >= 0 && !brakeDone && readMicros >= BrakeOnMicros)
            {
                brakeDone = true;
                Recorder.OnBrakeSwitch(true, BrakeOnMicros);
            }

            for (int i = 0; i < BurstSamples; i++)
            {
                long k = first + i;
                double tS = k * TruePeriodS;
                bool accelerating = tS * 1e6 >= LaunchMicros && tS * 1e6 <= accelerateUntilMicros;
                short forward = (short)(accelerating ? Math.Round(AccelerationMps2 / G0 * 1000) : 0);
                var v = new int[3];
                v[Settings.ForwardAxis] += Settings.ForwardAxisReversed ? -forward : forward;
                v[GravityAxis] += GravitySign * 1000;
                burst[i * 3] = (short)v[0];
                burst[(i * 3) + 1] = (short)v[1];
                burst[(i * 3) + 2] = (short)v[2];
                FedSamples[k + indexOffset] = ((short)v[0], (short)v[1], (short)v[2], tS);
            }

            Recorder.OnAccelBurst(burst, BurstSamples, first + indexOffset, readMicros);
            FedBursts.Add((last + indexOffset, readMicros));
            Recorder.Tick(readMicros);
        }
    }

    /// <summary>A second launch on the same box, from where this one left the counter.</summary>
    public LaunchDriver Next(long launchMicros, long startMicros) => new(this, launchMicros, startMicros)
    {
        CounterOrigin = CounterOrigin + LastCount,
        PollMicros = PollMicros,
        BurstSamples = BurstSamples,
        MaxReadLatencyMicros = MaxReadLatencyMicros,
        Seed = Seed + 1,
        GravityAxis = GravityAxis,
        GravitySign = GravitySign,
    };

    /// <summary>The exact time the count (from the origin) reaches <paramref name="count"/>, µs.</summary>
    public long EdgeMicros(long count) => LaunchMicros + (long)Math.Round(Math.Sqrt(2 * count * MetresPerPulse / AccelerationMps2) * 1e6);

    private void FeedPulsesUntil(long untilMicros, long accelerateUntilMicros, ref long nextEdge, ref long lastPoll, ref long polledCount)
    {
        if (PollMicros <= 0)
        {
            while (EdgeMicros(nextEdge) <= untilMicros && EdgeMicros(nextEdge) <= accelerateUntilMicros)
            {
                long t = EdgeMicros(nextEdge);
                Feed(nextEdge, t - 1, t);
                nextEdge++;
            }

            return;
        }

        for (long poll = lastPoll + PollMicros; poll <= untilMicros; poll += PollMicros)
        {
            long count = polledCount;
            while (EdgeMicros(count + 1) <= poll && EdgeMicros(count + 1) <= accelerateUntilMicros)
            {
                count++;
            }

            if (count != polledCount)
            {
                Feed(count, lastPoll, poll);
                polledCount = count;
            }

            lastPoll = poll;
        }
    }

    private void Feed(long count, long lo, long hi)
    {
        var observation = new PulseObservation { Channel = 0, Count = CounterOrigin + count, LoMicros = lo, HiMicros = hi };
        Recorder.OnPulseObservation(ref observation);
        FedPulses.Add(observation);
        LastCount = count;
        if (Settings.SecondChannelEnabled)
        {
            var second = new PulseObservation { Channel = 1, Count = CounterOrigin + count, LoMicros = lo + 2, HiMicros = hi + 3 };
            Recorder.OnPulseObservation(ref second);
            FedPulses.Add(second);
        }
    }
}
