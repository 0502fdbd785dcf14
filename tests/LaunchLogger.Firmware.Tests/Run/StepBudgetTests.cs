using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>The settings that bound one loop pass on an interpreted device (smaller pulse frames,
/// the pre-trigger samples written a share at a time) change how the log is cut into frames,
/// never what it says: the same observations and samples, with the same times, in order.</summary>
public class StepBudgetTests
{
    private const double HalfG = 0.5 * MotionProfile.G0;

    [Fact]
    public void SmallPulseFramesCarryTheSameObservations()
    {
        var plain = Record(new LoggerSettings());
        var small = Record(new LoggerSettings { PulseFrameMaxBodyBytes = 48 });

        Assert.Equal(Observations(plain), Observations(small));
        var frames = small.OfType<PulsesFrame>().ToList();
        Assert.True(frames.Count > 2 * plain.OfType<PulsesFrame>().Count(), "small frames should be many more");

        // 48 body bytes: at most 48 / 3 observations of one byte per field, fewer when wider.
        Assert.All(frames, f => Assert.InRange(f.Observations.Count, 1, 16));
    }

    [Fact]
    public void PreTriggerSamplesWrittenAShareAtATimeAreTheSameSamplesInOrder()
    {
        var plain = Record(new LoggerSettings());
        var spread = Record(new LoggerSettings { PreTriggerSamplesPerStep = 8 });

        Assert.Equal(Samples(plain), Samples(spread));
        Assert.Equal(Observations(plain), Observations(spread));

        // In the log the sample indices only rise: queued bursts wait behind the older ones.
        var indices = Samples(spread).Select(s => s.Index).ToList();
        Assert.Equal(indices.OrderBy(i => i), indices);

        // When the run opens none is written before the motion event; they follow a share per
        // pass instead of all at once.
        Assert.True(WrittenAtOpening(plain) > 500, "the plain run writes its pre-trigger samples at once");
        Assert.Equal(0, WrittenAtOpening(spread));
        Assert.Equal(plain.OfType<SummaryFrame>().Single().AccelSamplesWritten, spread.OfType<SummaryFrame>().Single().AccelSamplesWritten);
    }

    [Fact]
    public void BadBudgetSettingsAreRefused()
    {
        Assert.Contains("PulseFrameMaxBodyBytes", new LoggerSettings { PulseFrameMaxBodyBytes = 5 }.Validate());
        Assert.Contains("PreTriggerSamplesPerStep", new LoggerSettings { PreTriggerSamplesPerStep = -1 }.Validate());
        Assert.Null(new LoggerSettings { PulseFrameMaxBodyBytes = 3 * Varint.MaxBytes, PreTriggerSamplesPerStep = 1 }.Validate());
    }

    [Fact]
    public void TheBudgetIsWhatApplySets()
    {
        var settings = new LoggerSettings();
        StepBudget.Apply(settings);
        Assert.Equal((StepBudget.PulseFrameMaxBodyBytes, StepBudget.PreTriggerSamplesPerStep), (settings.PulseFrameMaxBodyBytes, settings.PreTriggerSamplesPerStep));
        Assert.Null(settings.Validate());

        var counter = new FakeMicrosecondCounter();
        var recorder = new RunRecorder(new LoggerSettings { AccelPresent = false }, new MemorySink(), null!);
        var loop = new CaptureLoop(new MonotonicClock(counter, null!), new EdgeObservationQueue(8, null!), null!, null!, null!, null!, recorder, 32, 20_000);
        StepBudget.Apply(loop);
        Assert.Equal(StepBudget.AccelSamplesPerStep, loop.MaxAccelSamplesPerStep);
    }

    private static IReadOnlyList<Frame> Record(LoggerSettings settings)
    {
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 5.0, 0.9 * MotionProfile.G0));
        run.RunUntil(9_000_000);
        recorder.Shutdown(run.NowMicros);
        return sink.Frames;
    }

    private static List<DecodedObservation> Observations(IReadOnlyList<Frame> frames) =>
        frames.OfType<PulsesFrame>().SelectMany(f => f.Observations).ToList();

    private static List<(long Index, AccelSample Sample, long ReadMicros)> Samples(IReadOnlyList<Frame> frames) =>
        frames.OfType<AccelerationFrame>().SelectMany(f => f.Samples.Select((s, i) => (f.FirstIndex + i, s, f.ReadMicros))).ToList();

    /// <summary>Acceleration samples written while the run opens: between the configuration frame
    /// and the motion event.</summary>
    private static int WrittenAtOpening(IReadOnlyList<Frame> frames)
    {
        int start = frames.ToList().FindIndex(f => f is ConfigurationFrame);
        return frames.Skip(start).TakeWhile(f => f is not EventFrame { Kind: EventKind.Motion }).OfType<AccelerationFrame>().Sum(f => f.Samples.Count);
    }
}
