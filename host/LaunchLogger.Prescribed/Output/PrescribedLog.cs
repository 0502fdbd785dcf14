using LaunchLogger.Firmware;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Output;

/// <summary>Writes a prescribed record as the box would: the firmware core's own capture loop,
/// run recorder and frame writer, fed from the generator's pulses and samples.</summary>
/// <remarks>The box's clock reads the record's time in microseconds (plus
/// <see cref="LogOptions.ClockStartMicros"/>), so a decoded time of t seconds is the record's
/// t − ClockStartMicros·1e-6. The box stages, opens and closes runs by its own rules
/// (RunRecorder): give it at least <see cref="LoggerSettings.StageHoldMicros"/> of stillness,
/// and one still-test block more (<see cref="LoggerSettings.StillBlockMicros"/>), before a standing start and more than <see cref="LoggerSettings.StopHoldMicros"/> at rest
/// after a stop.</remarks>
public static class PrescribedLog
{
    /// <summary>The log bytes for <paramref name="profile"/>.</summary>
    /// <param name="profile">The trajectory.</param>
    /// <param name="edgesS">The pickup's exact edge times (from <see cref="WheelPickup.EdgeTimes"/>).</param>
    /// <param name="pickup">The pickup (teeth; the stated circumference goes in the settings).</param>
    /// <param name="accelSamples">The accelerometer's samples, or null for none.</param>
    /// <param name="options">Capture and box options.</param>
    /// <param name="random">Noise for the capture.</param>
    public static byte[] Write(MotionProfile profile, IReadOnlyList<double> edgesS, WheelPickup pickup, AccelSample[]? accelSamples, LogOptions options, Random random)
    {
        ArgumentNullException.ThrowIfNull(profile);
        ArgumentNullException.ThrowIfNull(edgesS);
        ArgumentNullException.ThrowIfNull(pickup);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(random);
        var settings = new LoggerSettings
        {
            PulsesPerRevolution = pickup.Teeth,
            CircumferenceMicrometres = (int)Math.Round(pickup.Tyre.StatedCircumferenceM * 1e6),
            AccelPresent = accelSamples != null,
            AccelOutputDataRateMilliHz = (int)Math.Round(options.AccelRateHz * 1000),
        };
        if (options.StillBlockMicros > 0)
        {
            settings.StillBlockMicros = options.StillBlockMicros;
        }

        var health = new HealthCounters();
        var sink = new MemorySink();
        var recorder = new RunRecorder(settings, sink, health);
        var counter = new SetMicrosecondCounter { NowMicros = options.ClockStartMicros };
        var clock = new MonotonicClock(counter, health);
        recorder.SetCounterOrigin(0, options.CounterOrigin);

        EdgeListCounter? hardwareCounter = null;
        PolledPulseSource? polled = null;
        EdgeObservationQueue? queue = null;
        double[] loopTimes;
        double[] stamps = [];
        if (options.Capture.Polled is { } poll)
        {
            hardwareCounter = new EdgeListCounter(edgesS, options.CounterOrigin);
            polled = new PolledPulseSource(hardwareCounter, clock);
            loopTimes = poll.PollTimes(profile.EndS, random);
        }
        else
        {
            queue = new EdgeObservationQueue(1024, health);
            stamps = (options.Capture.Edges ?? new EdgeTiming()).Observe(edgesS, random);
            loopTimes = new PolledCounter(options.Capture.EdgeLoopPeriodS, options.Capture.EdgeLoopJitterFraction).PollTimes(profile.EndS, random);
        }

        ListAccelerometer? accelerometer = accelSamples is null ? null : new ListAccelerometer(
            accelSamples, settings.AccelOutputDataRateMilliHz, settings.AccelFullScaleMilliG, options.FifoDepth);
        SpanSwitch? brakeSwitch = options.BrakeSwitchDelayS is { } delay ? new SpanSwitch(BrakeSpans(profile, delay)) : null;
        int readMicros = (int)Math.Max(1000, Math.Min(10_000, 0.5 * options.FifoDepth / options.AccelRateHz * 1e6));
        var loop = new CaptureLoop(clock, (IPulseSource?)polled ?? queue!, accelerometer, brakeSwitch, null, null, recorder, options.FifoDepth, readMicros)
        {
            SwitchHoldMicros = options.SwitchHoldMicros,
        };

        int delivered = 0;
        foreach (double t in loopTimes)
        {
            long micros = options.ClockStartMicros + (long)Math.Round(t * 1e6);
            counter.NowMicros = micros;
            if (queue != null)
            {
                while (delivered < stamps.Length && stamps[delivered] <= t)
                {
                    queue.TryWriteEdge(0, options.CounterOrigin + delivered + 1, options.ClockStartMicros + (long)Math.Round(stamps[delivered] * 1e6));
                    delivered++;
                }
            }

            if (hardwareCounter != null && polled != null)
            {
                hardwareCounter.NowS = t;
                polled.Poll();
            }

            if (accelerometer != null)
            {
                accelerometer.NowS = t;
            }

            if (brakeSwitch != null)
            {
                brakeSwitch.NowS = t;
            }

            loop.Step();
        }

        if (recorder.Phase == RunPhase.Moving || recorder.Phase == RunPhase.RolledOut)
        {
            recorder.Shutdown(clock.NowMicros());
        }

        return sink.Bytes.ToArray();
    }

    /// <summary>Brake switch on from each onset (plus the switch's delay) until the next launch.</summary>
    private static List<(double OnS, double OffS)> BrakeSpans(MotionProfile profile, double delayS)
    {
        var spans = new List<(double, double)>();
        for (int i = 0; i < profile.Runs.Count; i++)
        {
            if (profile.Runs[i].BrakeOnsetS is { } onset)
            {
                double off = i + 1 < profile.Runs.Count ? profile.Runs[i + 1].StartS : double.PositiveInfinity;
                spans.Add((onset + delayS, off));
            }
        }

        return spans;
    }
}

/// <summary>Options for <see cref="PrescribedLog"/>.</summary>
public sealed record LogOptions
{
    /// <summary>How the pulses are captured.</summary>
    public LogCapture Capture { get; init; } = LogCapture.ExactEdges;

    /// <summary>The accelerometer's nominal rate, Hz (must match the samples given).</summary>
    public double AccelRateHz { get; init; } = 400;

    /// <summary>The accelerometer's FIFO depth, samples.</summary>
    public int FifoDepth { get; init; } = 32;

    /// <summary>The brake switch's delay after onset, s; null for no switch.</summary>
    public double? BrakeSwitchDelayS { get; init; }

    /// <summary>How long a switch level must hold before the core takes it, µs (20 ms, a
    /// board's usual debounce).</summary>
    public long SwitchHoldMicros { get; init; } = 20_000;

    /// <summary>The box clock's reading at the record's time 0, µs.</summary>
    public long ClockStartMicros { get; init; }

    /// <summary>The hardware counter's reading before the first pulse.</summary>
    public long CounterOrigin { get; init; }

    /// <summary>The box's still block, µs (<see cref="LoggerSettings.StillBlockMicros"/>); 0 for its default.</summary>
    public int StillBlockMicros { get; init; }
}
