using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>A launch made with the mark button held down (before the bench rest's 3-s hold is
/// reached): the box does not look for accelerometer onset while the button is down, so the run
/// opens on the first pulse. What the log still holds for the host: the pre-trigger ring's
/// samples from well before the launch, the same as a launch without the press.</summary>
public class MarkHeldLaunchTests
{
    /// <summary>A gentle launch (0.3 g): the first pulse (40.8 mm) comes about 0.17 s after it.</summary>
    private const double LaunchMps2 = 0.3 * MotionProfile.G0;

    private const long LaunchMicros = 2_000_000;

    [Fact]
    public void The_run_opens_on_the_first_pulse_and_its_pre_trigger_still_holds_the_launch()
    {
        (IReadOnlyList<Frame> plain, ScriptedRun plainRun) = Launch(markHeld: false);
        (IReadOnlyList<Frame> held, ScriptedRun heldRun) = Launch(markHeld: true);

        // Without the press the accelerometer opens the run within a few samples of the launch.
        EventFrame plainMotion = plain.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.AccelOnset, plainMotion.Cause);
        Assert.InRange(plainMotion.TimeMicros, LaunchMicros, LaunchMicros + 5_000);

        // With it, the first pulse opens the run: the box's own first-motion mark comes late,
        // by the time the car took to roll one pulse (d = a t²/2: t = √(2 · 0.0408 m / 2.94 m/s²) ≈ 0.167 s).
        EventFrame heldMotion = held.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.PulseCount, heldMotion.Cause);
        PulseObservation firstPulse = heldRun.Fed[0];
        Assert.Equal(firstPulse.LoMicros, heldMotion.TimeMicros);
        Assert.InRange(heldMotion.TimeMicros - LaunchMicros, 160_000, 175_000);

        // Both runs are staged with the same resting gravity vector (the host's rest level).
        EventFrame plainStaged = plain.SingleEvent(EventKind.Staged);
        EventFrame heldStaged = held.SingleEvent(EventKind.Staged);
        Assert.Equal((plainStaged.StagedX, plainStaged.StagedY, plainStaged.StagedZ), (heldStaged.StagedX, heldStaged.StagedY, heldStaged.StagedZ));
        Assert.Equal((0L, 0L, 1000L), (heldStaged.StagedX!.Value, heldStaged.StagedY!.Value, heldStaged.StagedZ!.Value));

        // The run's samples start a whole pre-trigger ring before its opening, so they reach
        // back past the launch (1.33 s with 1500 samples at 1 kHz and a 0.167-s roll), without a hole.
        List<(long Index, AccelSample Sample)> heldSamples = Samples(held);
        List<(long Index, AccelSample Sample)> plainSamples = Samples(plain);
        long launchIndex = (LaunchMicros / 1000) - 1; // sample n is taken at (n + 1) ms
        Assert.True(heldSamples[0].Index <= launchIndex - 1000, "pre-trigger starts at sample " + heldSamples[0].Index);
        for (int i = 1; i < heldSamples.Count; i++)
        {
            Assert.Equal(heldSamples[i - 1].Index + 1, heldSamples[i].Index);
        }

        // Every sample from a second before the launch to half a second after it is in both runs,
        // as it was measured: the host sees the same launch either way.
        var plainByIndex = plainSamples.ToDictionary(s => s.Index, s => s.Sample);
        var heldByIndex = heldSamples.ToDictionary(s => s.Index, s => s.Sample);
        for (long index = launchIndex - 1000; index <= launchIndex + 500; index++)
        {
            Assert.Equal(heldRun.Samples[(int)index].Sample, heldByIndex[index]);
            Assert.Equal(plainRun.Samples[(int)index].Sample, plainByIndex[index]);
            Assert.Equal(plainByIndex[index], heldByIndex[index]);
        }

        // The launch itself is in the samples: forward 0 before it, 300 mg from it.
        Assert.Equal(0, heldByIndex[launchIndex - 1].X);
        Assert.Equal(300, heldByIndex[launchIndex + 1].X);

        // The press arms no bench rest, and the release during the run writes nothing.
        Assert.Empty(held.OfType<BenchRestFrame>());
        Assert.DoesNotContain(held, f => f is EventFrame { Kind: EventKind.Mark });
    }

    /// <summary>Staged, a launch at 2 s; with <paramref name="markHeld"/> the mark button is
    /// pressed at 1.5 s and let go at 3 s (1.5 s: not the bench rest's 3 s).</summary>
    private static (IReadOnlyList<Frame> Frames, ScriptedRun Run) Launch(bool markHeld)
    {
        var settings = new LoggerSettings();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(LaunchMicros / 1e6, LaunchMps2));
        run.RunUntil(1_500_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        if (markHeld)
        {
            recorder.OnMarkButton(true, run.NowMicros);
        }

        run.RunUntil(3_000_000);
        if (markHeld)
        {
            recorder.OnMarkButton(false, run.NowMicros);
        }

        run.RunUntil(4_000_000);
        Assert.Equal(1, recorder.RunNumber);
        return (sink.Frames, run);
    }

    private static List<(long Index, AccelSample Sample)> Samples(IReadOnlyList<Frame> frames) =>
        frames.OfType<AccelerationFrame>().SelectMany(a => a.Samples.Select((s, i) => (a.FirstIndex + i, s))).ToList();
}
