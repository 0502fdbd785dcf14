using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>Feeds a <see cref="RunRecorder"/> from a <see cref="MotionProfile"/> the way the box
/// would: every 20 ms, the pulse observations of that stretch (in time order), then one burst of
/// 20 accelerometer samples at 1 kHz (forward acceleration on the forward axis, +1000 mg on z at
/// rest; <see cref="SamplesPerBurst"/> sets another burst and with it the step), then a tick. Keeps everything it fed so tests can compare the log with the truth.</summary>
/// <remarks>Pulse edges: edge n of a channel is where the car has rolled n × (circumference ÷
/// pulses per revolution). Exact timing gives each edge a 1 µs bracket ending at the edge's
/// microsecond, rounded up; polled timing reads the counters every <see cref="PollPeriodMicros"/>
/// and brackets each change from the previous poll's first clock reading to this poll's last,
/// so consecutive brackets overlap by <see cref="PollReadMicros"/>.</remarks>
public sealed class ScriptedRun
{
    public const int BurstSamples = 20;

    private readonly RunRecorder recorder;
    private readonly LoggerSettings settings;
    private readonly MotionProfile profile;
    private readonly double[] metresPerPulse;
    private readonly long[] nextEdge;
    private readonly long[] polledCount;
    private short[] burst = new short[BurstSamples * 3];
    private readonly long periodMicros;
    private long lastPollBeforeMicros;
    private long nextPollMicros;

    public ScriptedRun(RunRecorder recorder, LoggerSettings settings, MotionProfile profile)
    {
        this.recorder = recorder;
        this.settings = settings;
        this.profile = profile;
        int channels = settings.ChannelCount;
        metresPerPulse = new double[channels];
        metresPerPulse[0] = settings.CircumferenceMicrometres * 1e-6 / settings.PulsesPerRevolution;
        if (channels > 1)
        {
            metresPerPulse[1] = settings.SecondCircumferenceMicrometres * 1e-6 / settings.SecondPulsesPerRevolution;
        }

        nextEdge = new long[channels];
        polledCount = new long[channels];
        for (int c = 0; c < channels; c++)
        {
            nextEdge[c] = 1;
            recorder.SetCounterOrigin(c, 0);
        }

        periodMicros = settings.AccelPresent ? 1_000_000_000L / settings.AccelOutputDataRateMilliHz : 1000;
    }

    /// <summary>0 for exact edge times (1 µs brackets); otherwise the counter poll period, µs.</summary>
    public long PollPeriodMicros { get; init; }

    /// <summary>Samples in each burst (<see cref="BurstSamples"/> unless told): a step is as long as
    /// they take at the data rate, as a box that reads its FIFO at that interval.</summary>
    public int SamplesPerBurst { get; init; } = BurstSamples;

    /// <summary>How long one poll takes, from its first clock reading to its last, µs.</summary>
    public long PollReadMicros { get; init; } = 3;

    /// <summary>Changes a sample before it is fed (clipping, noise): (sample time µs, sample) → sample.</summary>
    public Func<long, AccelSample, AccelSample>? AccelModifier { get; init; }

    /// <summary>How far the script has fed the recorder, µs.</summary>
    public long NowMicros { get; private set; }

    /// <summary>Every pulse observation fed, in order.</summary>
    public List<PulseObservation> Fed { get; } = new();

    /// <summary>Every accelerometer sample fed, by index, with the burst read time it came with.</summary>
    public List<(AccelSample Sample, long ReadMicros)> Samples { get; } = new();

    public double MetresPerPulse(int channel) => metresPerPulse[channel];

    /// <summary>The true time of edge <paramref name="n"/> of a channel, in µs (not rounded).</summary>
    public double EdgeMicros(int channel, long n) => profile.TimeAtDistance(n * metresPerPulse[channel]) * 1e6;

    /// <summary>The true cumulative count of a channel at <paramref name="micros"/>.</summary>
    public long CountAt(int channel, double micros)
    {
        long n = (long)Math.Floor((profile.DistanceAt(micros / 1e6) / metresPerPulse[channel]) + 1e-9);
        while (n > 0 && EdgeMicros(channel, n) > micros)
        {
            n--;
        }

        while (EdgeMicros(channel, n + 1) <= micros)
        {
            n++;
        }

        return n;
    }

    /// <summary>Feeds whole 20 ms steps until <paramref name="endMicros"/> is reached.</summary>
    public void RunUntil(long endMicros)
    {
        long step = periodMicros * SamplesPerBurst;
        while (NowMicros + step <= endMicros)
        {
            Step(NowMicros + step);
        }
    }

    private void Step(long stepEnd)
    {
        if (PollPeriodMicros == 0)
        {
            FeedExactEdges(stepEnd);
        }
        else
        {
            FeedPolls(stepEnd);
        }

        if (settings.AccelPresent)
        {
            FeedBurst(stepEnd);
        }

        recorder.Tick(stepEnd);
        NowMicros = stepEnd;
    }

    private void FeedExactEdges(long stepEnd)
    {
        var due = new List<PulseObservation>();
        for (int c = 0; c < nextEdge.Length; c++)
        {
            while (true)
            {
                double edge = EdgeMicros(c, nextEdge[c]);
                if (edge > stepEnd)
                {
                    break;
                }

                long hi = (long)Math.Ceiling(edge);
                due.Add(new PulseObservation { Channel = c, Count = nextEdge[c], LoMicros = hi - 1, HiMicros = hi });
                nextEdge[c]++;
            }
        }

        foreach (PulseObservation o in due.OrderBy(o => o.HiMicros).ThenBy(o => o.Channel))
        {
            Feed(o);
        }
    }

    private void FeedPolls(long stepEnd)
    {
        if (nextPollMicros == 0)
        {
            nextPollMicros = PollPeriodMicros;
        }

        while (nextPollMicros <= stepEnd)
        {
            long before = nextPollMicros;
            long after = before + PollReadMicros;
            double readAt = before + (PollReadMicros / 2.0);
            for (int c = 0; c < polledCount.Length; c++)
            {
                long count = CountAt(c, readAt);
                if (count != polledCount[c])
                {
                    Feed(new PulseObservation { Channel = c, Count = count, LoMicros = lastPollBeforeMicros, HiMicros = after });
                    polledCount[c] = count;
                }
            }

            lastPollBeforeMicros = before;
            nextPollMicros += PollPeriodMicros;
        }
    }

    private void FeedBurst(long stepEnd)
    {
        long firstIndex = Samples.Count;
        if (burst.Length != SamplesPerBurst * 3)
        {
            burst = new short[SamplesPerBurst * 3];
        }

        for (int i = 0; i < SamplesPerBurst; i++)
        {
            long index = firstIndex + i;
            long t = (index + 1) * periodMicros;
            double forwardMilliG = profile.AccelAt(t / 1e6) / MotionProfile.G0 * 1000;
            var sample = new AccelSample(0, 0, 1000);
            sample = settings.ForwardAxis switch
            {
                0 => sample with { X = (short)Math.Round(forwardMilliG) },
                1 => sample with { Y = (short)Math.Round(forwardMilliG) },
                _ => sample with { Z = (short)(1000 + Math.Round(forwardMilliG)) },
            };
            if (AccelModifier != null)
            {
                sample = AccelModifier(t, sample);
            }

            burst[i * 3] = sample.X;
            burst[(i * 3) + 1] = sample.Y;
            burst[(i * 3) + 2] = sample.Z;
            Samples.Add((sample, stepEnd));
        }

        recorder.OnAccelBurst(burst, SamplesPerBurst, firstIndex, stepEnd);
    }

    private void Feed(PulseObservation o)
    {
        Fed.Add(o);
        recorder.OnPulseObservation(ref o);
    }

    /// <summary>A recorder with a fresh memory sink and health counters.</summary>
    public static (RunRecorder Recorder, MemorySink Sink, HealthCounters Health) NewRecorder(LoggerSettings settings)
    {
        var sink = new MemorySink();
        var health = new HealthCounters();
        return (new RunRecorder(settings, sink, health), sink, health);
    }
}
