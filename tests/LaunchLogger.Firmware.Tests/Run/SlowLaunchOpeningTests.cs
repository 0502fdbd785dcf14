using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;
using Xunit.Abstractions;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>A launch only just over the motion threshold under the longest still block: the onset
/// window (a whole block, <see cref="RunRecorder.OnsetWindowSamples"/>) passes the threshold only
/// when nearly all of it lies after the launch, so the run opens up to a block after first motion.
/// What the log must still hold: the samples the host reads from before first motion, the box's
/// first-motion mark where the launch began, and its rollout mark as under a short block.</summary>
/// <remarks>The launch: a constant 42 mg from rest (threshold 40 mg), the slowest a box at rest
/// times by its accelerometer: the mean of 500 samples passes 40 mg 477 samples after it. The host
/// needs from before first motion: its onset search starts 0.5 s before the box's mark when it has
/// no pulses to go by (<c>AccelSetup</c>'s onset search), and its resting level takes the samples
/// from up to 2 s before down to 30 ms before the onset (at least 8;
/// <c>AccelSetup</c>), its σ shrinking with their number.</remarks>
public class SlowLaunchOpeningTests(ITestOutputHelper output)
{
    private const double LaunchMilliG = 42;
    private const double LaunchS = 5.0;
    private const double HostLookBackS = 0.5;

    public static TheoryData<string, int, int, bool> Boards => new()
    {
        // board, data rate (Hz), samples per FIFO read, the ESP32's per-pass bounds (StepBudget)
        { "core defaults (1 kHz, the simulator's 20-sample reads)", 1000, 20, false },
        { "Linux board at 1344 Hz (FIFO read at half depth: 16 samples)", 1344, 16, false },
        { "Linux board at 400 Hz", 400, 16, false },
        { "ESP32 at 400 Hz (read every 10 ms: 4 samples; 128 reads fill the ring's burst list first)", 400, 4, true },
    };

    [Theory]
    [MemberData(nameof(Boards))]
    public void Under_the_longest_still_block_the_pre_run_samples_still_reach_back_past_what_the_host_reads(string board, int rateHz, int samplesPerRead, bool esp32Bounds)
    {
        (long lateMicros, double reachS, int samples) = PreRun(rateHz, samplesPerRead, esp32Bounds, LoggerSettings.MaxStillBlockMs);
        (long defaultLateMicros, double defaultReachS, int defaultSamples) = PreRun(rateHz, samplesPerRead, esp32Bounds, LoggerSettings.DefaultStillBlockMs);
        output.WriteLine($"{board}: run opened {lateMicros / 1e3:F1} ms after first motion, samples from {reachS:F3} s before it ({samples}); under the default block {defaultLateMicros / 1e3:F1} ms, {defaultReachS:F3} s ({defaultSamples})");

        // The run opens late, by up to a block and a read: the window's 500 ms hold 477 ms of the launch.
        long readMicros = samplesPerRead * (1_000_000 / rateHz);
        Assert.InRange(lateMicros, LoggerSettings.MaxStillBlockMs * 1000 / 2, (LoggerSettings.MaxStillBlockMs * 1000) + readMicros);

        // What it costs before first motion: no more than that lateness, and what is left reaches
        // back past the host's look-back.
        Assert.True(reachS >= defaultReachS - ((lateMicros - defaultLateMicros + readMicros) / 1e6), $"{board}: {reachS:F3} s against {defaultReachS:F3} s");
        Assert.True(reachS >= HostLookBackS, $"{board}: the log's samples start only {reachS:F3} s before first motion");
    }

    /// <summary>The launch under a still block of <paramref name="stillBlockMs"/>: how long after
    /// first motion the run opened (µs), and how far before it (s) and with how many samples the
    /// run's samples reach, after checking they have no hole and that first motion is the launch.</summary>
    private static (long LateMicros, double ReachS, int Samples) PreRun(int rateHz, int samplesPerRead, bool esp32Bounds, int stillBlockMs)
    {
        LoggerSettings settings = new()
        {
            AccelOutputDataRateMilliHz = rateHz * 1000,
            StillBlockMicros = stillBlockMs * 1000,
            PulsesPerRevolution = 1, // one pulse per 1.96 m: the accelerometer opens the run, at its latest
        };
        if (esp32Bounds)
        {
            StepBudget.Apply(settings);
        }

        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(LaunchS, LaunchMilliG / 1000 * MotionProfile.G0)) { SamplesPerBurst = samplesPerRead };
        run.RunUntil((long)((LaunchS + 1.5) * 1e6));

        IReadOnlyList<Frame> frames = sink.Frames;
        long periodMicros = 1_000_000 / rateHz;
        EventFrame motion = frames.SingleEvent(EventKind.Motion);
        ConfigurationFrame configuration = Assert.Single(frames.OfType<ConfigurationFrame>());
        Assert.Equal(MotionCause.AccelOnset, motion.Cause);
        Assert.InRange(motion.TimeMicros - LaunchSampleMicros(rateHz), 0, 2 * periodMicros);

        List<long> indices = frames.OfType<AccelerationFrame>().SelectMany(a => Enumerable.Range(0, a.Samples.Count).Select(i => a.FirstIndex + i)).ToList();
        Assert.Equal(Enumerable.Range(0, indices.Count).Select(i => indices[0] + i), indices);
        double reachS = (motion.TimeMicros - ((indices[0] + 1) * periodMicros)) / 1e6; // sample n is taken at (n + 1) periods
        return (configuration.OpenedMicros - motion.TimeMicros, reachS, indices.Count(i => (i + 1) * periodMicros < motion.TimeMicros));
    }

    [Theory]
    [InlineData(48)] // 40.8 mm a pulse: the first pulse (at 0.445 s) comes before the long block's window passes (0.477 s)
    [InlineData(4)]  // 490 mm a pulse: the rollout (304.8 mm) is reached at the first pulse, drawn from first motion
    public void The_boxs_marks_of_a_slow_launch_are_the_same_under_the_longest_block_as_under_the_default(int pulsesPerRevolution)
    {
        (EventFrame defaultMotion, EventFrame defaultRollout) = Marks(LoggerSettings.DefaultStillBlockMs, pulsesPerRevolution);
        (EventFrame longMotion, EventFrame longRollout) = Marks(LoggerSettings.MaxStillBlockMs, pulsesPerRevolution);
        long launchMicros = LaunchSampleMicros(1000);

        // First motion where the launch began, under either block (a pulse that opens the run
        // first takes it from the stretch over the threshold the accelerometer has under way).
        Assert.Equal(MotionCause.AccelOnset, defaultMotion.Cause);
        Assert.InRange(defaultMotion.TimeMicros - launchMicros, 0, 2000);
        Assert.Equal(pulsesPerRevolution == 48 ? MotionCause.PulseCount : MotionCause.AccelOnset, longMotion.Cause);
        Assert.Equal(defaultMotion.TimeMicros, longMotion.TimeMicros);

        // The rollout mark: the same, and for the fine pickup (interpolated between pulses 7 and 8)
        // close to the closed form, t = √(2 d / a) after the launch (constant acceleration from rest).
        Assert.Equal(defaultRollout.TimeMicros, longRollout.TimeMicros);
        Assert.Equal(defaultRollout.SpeedMillimetresPerSecond, longRollout.SpeedMillimetresPerSecond);
        if (pulsesPerRevolution == 48)
        {
            double trueMicros = (LaunchS + Math.Sqrt(2 * 0.3048 / (LaunchMilliG / 1000 * MotionProfile.G0))) * 1e6;
            Assert.InRange(longRollout.TimeMicros - trueMicros, -2000, 2000);
        }
    }

    [Fact]
    public void A_creep_below_the_threshold_through_an_idle_shake_keeps_its_mark_between_its_start_and_its_first_pulse()
    {
        // 20 mg (half the threshold) under an 80 mg shake at 20 Hz along the car: the onset never
        // passes, the first pulse (0.65 s on) opens the run, and the shake's short stretches over
        // the threshold must not carry the mark before the creep began.
        LoggerSettings settings = new() { StillBlockMicros = LoggerSettings.MaxStillBlockMs * 1000 };
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(LaunchS, 0.020 * MotionProfile.G0))
        {
            AccelModifier = AccelShaker.Make(7, 2.0, 80, 20, 40, 20),
        };
        run.RunUntil((long)((LaunchS + 1.0) * 1e6));

        EventFrame motion = sink.Frames.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.PulseCount, motion.Cause);
        Assert.InRange(motion.TimeMicros, (long)(LaunchS * 1e6), run.Fed[0].LoMicros);
    }

    [Fact]
    public void A_launch_with_the_mark_button_down_keeps_its_mark_at_its_first_pulse_whatever_the_shake_did_at_the_press()
    {
        // Onset is not followed while the button is down, so the running sum stands as the press
        // left it; pressed on the shake's peaks it shows a stretch over the threshold, from the press
        // (MarkHeldLaunchTests: the mark is the first pulse's bracket start, late by one pulse's roll).
        for (int k = 0; k < 8; k++)
        {
            LoggerSettings settings = new();
            var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
            var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(LaunchS, 0.3 * MotionProfile.G0))
            {
                AccelModifier = AccelShaker.Make(20 + k, 2.0, 80, 20, 40, 20),
            };
            run.RunUntil((long)((LaunchS - 0.5) * 1e6) + (k * 5000));
            Assert.Equal(RunPhase.Staged, recorder.Phase);
            recorder.OnMarkButton(true, run.NowMicros);
            run.RunUntil((long)((LaunchS + 1.0) * 1e6));

            EventFrame motion = sink.Frames.SingleEvent(EventKind.Motion);
            Assert.Equal(MotionCause.PulseCount, motion.Cause);
            Assert.Equal(run.Fed[0].LoMicros, motion.TimeMicros);
        }
    }

    private static (EventFrame Motion, EventFrame Rollout) Marks(int stillBlockMs, int pulsesPerRevolution)
    {
        LoggerSettings settings = new() { StillBlockMicros = stillBlockMs * 1000, PulsesPerRevolution = pulsesPerRevolution };
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(LaunchS, LaunchMilliG / 1000 * MotionProfile.G0));
        run.RunUntil((long)((LaunchS + 2.5) * 1e6));
        return (sink.Frames.SingleEvent(EventKind.Motion), sink.Frames.SingleEvent(EventKind.Rollout));
    }

    /// <summary>The launch's first sample (sample n is taken at (n + 1) periods).</summary>
    private static long LaunchSampleMicros(int rateHz)
    {
        long periodMicros = 1_000_000 / rateHz;
        return (long)Math.Ceiling(LaunchS * 1e6 / periodMicros) * periodMicros;
    }
}
