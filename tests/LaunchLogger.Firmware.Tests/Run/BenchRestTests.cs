using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>The bench rest: the mark button held while staged records the accelerometer outside
/// any run (LOG-FORMAT.md, 0x09 and 0x0A), driven through the capture loop as a board drives it.</summary>
public class BenchRestTests
{
    [Fact]
    public void A_three_second_hold_while_staged_records_a_rest_from_the_release_and_then_waits_again()
    {
        var box = new Box();
        box.RunTo(2_000_000);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        box.Mark.Active = true;
        box.RunTo(4_900_000);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        box.RunTo(5_500_000);
        Assert.Equal(RunPhase.BenchRest, box.Recorder.Phase);
        Assert.False(box.Recorder.BenchRestRecording);
        box.Mark.Active = false;
        box.RunTo(27_000_000);

        IReadOnlyList<Frame> frames = box.Sink.Frames;
        BenchRestFrame open = Assert.Single(frames.OfType<BenchRestFrame>());
        BenchRestEndFrame end = Assert.Single(frames.OfType<BenchRestEndFrame>());
        Assert.Equal(1, open.RestNumber);
        Assert.Equal(5_501_000, open.OpenedMicros);
        Assert.Equal(20_000_000, open.LengthMicros);
        Assert.Equal(1_000_000, open.AccelRateMilliHz);
        Assert.Equal(0, open.ForwardAxis);
        Assert.Equal(LogFormat.BenchRestComplete, end.Outcome);
        Assert.InRange(end.EndedMicros, 25_501_000, 25_502_000);
        Assert.Equal(0, end.SamplesLost);

        // Between the two: acceleration frames only, numbered without a hole, about 20 s of 1 kHz.
        int from = IndexOf(frames, open);
        int to = IndexOf(frames, end);
        var inRest = frames.Skip(from + 1).Take(to - from - 1).ToList();
        var accel = Assert.IsAssignableFrom<IReadOnlyList<Frame>>(inRest).Select(f => Assert.IsType<AccelerationFrame>(f)).ToList();
        Assert.Equal(end.SamplesWritten, accel.Sum(a => a.Samples.Count));
        Assert.Equal(end.FramesInRest, accel.Count + 2);
        Assert.InRange(end.SamplesWritten, 19_950, 20_050);
        for (int i = 1; i < accel.Count; i++)
        {
            Assert.Equal(accel[i - 1].FirstIndex + accel[i - 1].Samples.Count, accel[i].FirstIndex);
        }

        Assert.All(accel, a => Assert.All(a.Samples, s => Assert.Equal(1000, s.X)));

        // Not a run: no configuration or summary; the box stages again after it.
        Assert.Empty(frames.OfType<ConfigurationFrame>());
        Assert.Empty(frames.OfType<SummaryFrame>());
        Assert.Equal(new[] { RunPhase.Idle, RunPhase.Staged, RunPhase.BenchRest, RunPhase.Idle, RunPhase.Staged }, box.Indicator.Shown);
    }

    [Fact]
    public void A_short_press_records_nothing_and_its_jolt_opens_no_run()
    {
        var box = new Box();
        box.RunTo(2_000_000);
        box.Mark.Active = true;

        // Pressing the button pushes the box along its (vertical) forward axis: +200 mg for 0.3 s
        // from just after the contact closed, far past the 40 mg onset threshold.
        box.Jolt = (2_005_000, 2_300_000, 200);
        box.RunTo(3_000_000);
        box.Mark.Active = false;
        box.RunTo(6_000_000);

        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        Assert.Equal(0, box.Recorder.RunNumber);
        Assert.Equal(0, box.Recorder.BenchRestNumber);
        Assert.Equal(new[] { FrameType.PowerUp }, box.Sink.Frames.Select(f => f.Type));
    }

    [Fact]
    public void A_pulse_during_the_rest_ends_it_as_spoiled()
    {
        var box = new Box();
        box.Press(2_000_000, 5_200_000);
        box.RunTo(10_000_000);
        box.Pulses[0] += 1;
        box.RunTo(10_500_000);

        BenchRestEndFrame end = Assert.Single(box.Sink.Frames.OfType<BenchRestEndFrame>());
        Assert.Equal(LogFormat.BenchRestSpoiledByPulse, end.Outcome);
        Assert.InRange(end.EndedMicros, 10_000_000, 10_002_000);
        Assert.NotEqual(RunPhase.BenchRest, box.Recorder.Phase);
        Assert.False(box.Recorder.BenchRestRecording);
    }

    [Fact]
    public void A_pulse_while_armed_drops_the_rest_and_opens_a_run_as_staged()
    {
        var box = new Box();
        box.RunTo(2_000_000);
        box.Mark.Active = true;
        box.RunTo(5_200_000);
        Assert.Equal(RunPhase.BenchRest, box.Recorder.Phase);
        box.Pulses[0] += 1;
        box.RunTo(5_300_000);

        Assert.Empty(box.Sink.Frames.OfType<BenchRestFrame>());
        Assert.Equal(MotionCause.PulseCount, box.Sink.Frames.SingleEvent(EventKind.Motion).Cause);
        Assert.Equal(1, box.Recorder.RunNumber);
    }

    [Fact]
    public void A_shutdown_during_the_rest_ends_it_as_cut_short()
    {
        var box = new Box();
        box.Press(2_000_000, 5_200_000);
        box.RunTo(8_000_000);
        box.Recorder.Shutdown(8_000_000);

        BenchRestEndFrame end = Assert.Single(box.Sink.Frames.OfType<BenchRestEndFrame>());
        Assert.Equal(LogFormat.BenchRestCutShort, end.Outcome);
        Assert.Equal(8_000_000, end.EndedMicros);
    }

    [Fact]
    public void Without_an_accelerometer_a_hold_arms_nothing()
    {
        var settings = new LoggerSettings { AccelPresent = false };
        var recorder = new RunRecorder(settings, new MemorySink(), new HealthCounters());
        recorder.SetCounterOrigin(0, 0);
        recorder.Tick(2_000_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        recorder.OnMarkButton(true, 2_000_000);
        recorder.Tick(9_000_000);
        recorder.OnMarkButton(false, 9_000_000);
        recorder.Tick(10_000_000);

        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Equal(0, recorder.BenchRestNumber);
    }

    /// <summary>The second of two identical rests, each on a fresh recorder, is measured: the
    /// first one's calls are the host's first (its JIT compiles them and loads their types on
    /// this thread, now and then allocating), which says nothing of the device.</summary>
    [Fact]
    public void Recording_a_rest_allocates_nothing()
    {
        RecordOneRest(out _);
        RunRecorder recorder = RecordOneRest(out long allocated);

        Assert.Equal(0, allocated);
        Assert.Equal(1, recorder.BenchRestNumber);
        Assert.False(recorder.BenchRestRecording);
    }

    /// <summary>Stages a recorder, then holds the mark button 3.1 s, loses a burst mid-rest and lets
    /// the rest run out; <paramref name="allocated"/> is what this thread allocated from the press on.</summary>
    private static RunRecorder RecordOneRest(out long allocated)
    {
        var recorder = new RunRecorder(new LoggerSettings(), new CountingSink(), new HealthCounters());
        recorder.SetCounterOrigin(0, 0);
        short[] burst = new short[20 * 3];
        for (int i = 0; i < 20; i++)
        {
            burst[i * 3] = 1000;
        }

        long now = 0;
        long index = 0;
        void Feed(long untilMicros)
        {
            while (now < untilMicros)
            {
                now += 20_000;
                recorder.OnAccelBurst(burst, 20, index, now);
                index += 20;
                recorder.Tick(now);
            }
        }

        Feed(2_000_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        long before = GC.GetAllocatedBytesForCurrentThread();
        recorder.OnMarkButton(true, now);
        Feed(5_100_000);
        recorder.OnMarkButton(false, now);
        Feed(15_000_000);
        recorder.OnAccelGap(4, now);
        Feed(26_000_000);
        allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        return recorder;
    }

    private static int IndexOf(IReadOnlyList<Frame> frames, Frame frame)
    {
        for (int i = 0; i < frames.Count; i++)
        {
            if (ReferenceEquals(frames[i], frame))
            {
                return i;
            }
        }

        return -1;
    }

    /// <summary>The box on the bench, standing on its end with the forward axis (x) up: +1 g on x,
    /// a 1 kHz accelerometer read every 20 ms, the loop passing every millisecond.</summary>
    private sealed class Box
    {
        private readonly PolledPulseSource source;
        private readonly CaptureLoop loop;

        public Box()
        {
            Counter = new FakeMicrosecondCounter(0);
            var clock = new MonotonicClock(Counter, Health);
            Recorder = new RunRecorder(new LoggerSettings(), Sink, Health);
            var accelerometer = new FakeAccelerometer(Counter, 0, 1000, 64, t => new AccelSample((short)(t >= Jolt.FromMicros && t < Jolt.ToMicros ? 1000 + Jolt.MilliG : 1000), 0, 0));
            source = new PolledPulseSource(Pulses, clock);
            Recorder.SetCounterOrigin(0, Pulses[0]);
            loop = new CaptureLoop(clock, source, accelerometer, null, Mark, Indicator, Recorder, 64, 20_000);
        }

        /// <summary>A push along x over a stretch of sample times.</summary>
        public (long FromMicros, long ToMicros, int MilliG) Jolt { get; set; }

        public FakeMicrosecondCounter Counter { get; }

        public HealthCounters Health { get; } = new();

        public FakePulseCounter Pulses { get; } = new(1);

        public FakeDigitalInput Mark { get; } = new();

        public RecordingIndicator Indicator { get; } = new();

        public MemorySink Sink { get; } = new();

        public RunRecorder Recorder { get; }

        /// <summary>Runs to <paramref name="fromMicros"/>, presses the mark button, runs to
        /// <paramref name="toMicros"/> and lets it go.</summary>
        public void Press(long fromMicros, long toMicros)
        {
            RunTo(fromMicros);
            Mark.Active = true;
            RunTo(toMicros);
            Mark.Active = false;
        }

        public void RunTo(long micros)
        {
            while (Counter.TrueMicros + 1000 <= (ulong)micros)
            {
                Counter.TrueMicros += 1000;
                source.Poll();
                loop.Step();
            }
        }
    }
}
