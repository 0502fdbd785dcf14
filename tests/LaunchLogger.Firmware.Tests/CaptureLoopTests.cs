using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests;

public class CaptureLoopTests
{
    private const double HalfG = 0.5 * MotionProfile.G0;

    [Fact]
    public void EachPhaseChangeIsShownOnTheIndicatorOnce()
    {
        var rig = new Rig(MotionProfile.LaunchAndStop(2.5, HalfG, 4.0, 0.8 * MotionProfile.G0));
        rig.RunTo(7_500_000);

        Assert.Equal(new[] { RunPhase.Idle, RunPhase.Staged, RunPhase.Moving, RunPhase.RolledOut, RunPhase.Stopped }, rig.Indicator.Shown);
        IReadOnlyList<Frame> frames = rig.Sink.Frames;
        Assert.IsType<SummaryFrame>(frames[^1]);
        Assert.Equal(MotionCause.AccelOnset, frames.SingleEvent(EventKind.Motion).Cause);
        Assert.Equal(0, rig.Health.AccelFifoOverflows);
        Assert.Equal(0, rig.Health.AccelReadFailures);
    }

    [Fact]
    public void AFailedAccelerometerReadIsCountedAndTheSamplesComeNextTime()
    {
        var rig = new Rig(MotionProfile.Launch(2.5, HalfG));
        rig.RunTo(3_000_000);
        rig.Accelerometer.FailNextRead = true;
        rig.RunTo(3_500_000);
        rig.Recorder.Shutdown(3_500_000);

        Assert.Equal(1, rig.Health.AccelReadFailures);
        Assert.Equal(0, rig.Health.AccelFifoOverflows);

        // No sample was lost: the in-run frames number the samples without a hole.
        var accel = rig.Sink.Frames.OfType<AccelerationFrame>().ToList();
        for (int i = 1; i < accel.Count; i++)
        {
            Assert.Equal(accel[i - 1].FirstIndex + accel[i - 1].Samples.Count, accel[i].FirstIndex);
        }

        Assert.Equal(1, Assert.IsType<HealthFrame>(rig.Sink.Frames[^2]).Counters[2]);
    }

    [Fact]
    public void AFifoOverflowGivesAnAccelGapEventWithTheEstimatedLoss()
    {
        var rig = new Rig(MotionProfile.Launch(2.5, HalfG));
        rig.RunTo(3_000_000);

        // The loop stalls for 200 ms (a slow card write): the 64-sample FIFO overflows.
        rig.Counter.TrueMicros += 200_000;
        rig.RunTo(3_400_000);
        rig.Recorder.Shutdown(3_400_000);

        Assert.Equal(1, rig.Health.AccelFifoOverflows);
        IReadOnlyList<Frame> frames = rig.Sink.Frames;
        EventFrame gap = frames.SingleEvent(EventKind.AccelGap);
        Assert.InRange(gap.LostSamples!.Value, rig.Accelerometer.TrulyLost - 1, rig.Accelerometer.TrulyLost + 1);

        // The burst read with the overflow is numbered past the gap, close to its true index.
        var afterGap = frames.OfType<AccelerationFrame>().First(a => a.ReadMicros == gap.TimeMicros);
        var read = rig.Accelerometer.Reads.Single(r => r.Overflowed);
        Assert.InRange(afterGap.FirstIndex, read.FirstTrueIndex - 1, read.FirstTrueIndex + 1);
    }

    [Fact]
    public void ACappedReadEmptiesTheFifoOverSeveralPassesWithoutLosingOrMisnumberingSamples()
    {
        var rig = new Rig(MotionProfile.Launch(2.5, HalfG));
        rig.Loop.MaxAccelSamplesPerStep = 8;
        rig.RunTo(3_000_000);

        // A 200 ms stall overflows the 64-sample FIFO; the backlog is then read 8 at a time.
        rig.Counter.TrueMicros += 200_000;
        rig.RunTo(3_400_000);
        rig.Recorder.Shutdown(3_400_000);

        Assert.All(rig.Accelerometer.Reads, r => Assert.InRange(r.Count, 0, 8));
        Assert.Equal(1, rig.Health.AccelFifoOverflows);
        IReadOnlyList<Frame> frames = rig.Sink.Frames;
        EventFrame gap = frames.SingleEvent(EventKind.AccelGap);
        Assert.InRange(gap.LostSamples!.Value, rig.Accelerometer.TrulyLost - 1, rig.Accelerometer.TrulyLost + 1);

        // Every read after the gap is numbered from its true index, and the in-run frames number
        // the samples without a hole apart from the gap.
        var accel = frames.OfType<AccelerationFrame>().Where(a => a.ReadMicros >= gap.TimeMicros).ToList();
        var reads = rig.Accelerometer.Reads.SkipWhile(r => !r.Overflowed).Where(r => r.Count > 0).ToList();
        Assert.InRange(accel[0].FirstIndex, reads[0].FirstTrueIndex - 1, reads[0].FirstTrueIndex + 1);
        for (int i = 1; i < accel.Count; i++)
        {
            Assert.Equal(accel[i - 1].FirstIndex + accel[i - 1].Samples.Count, accel[i].FirstIndex);
        }
    }

    [Fact]
    public void BrakeSwitchAndMarkButtonBecomeEventsOnce()
    {
        var rig = new Rig(MotionProfile.Launch(2.5, HalfG));
        rig.RunTo(3_000_000);
        rig.Brake.Active = true;
        rig.RunTo(3_200_000);
        rig.Mark.Active = true;
        rig.RunTo(3_250_000);
        rig.Mark.Active = false;
        rig.RunTo(3_500_000);
        rig.Brake.Active = false;
        rig.RunTo(3_600_000);
        rig.Recorder.Shutdown(3_600_000);

        // Each is stamped with the first loop pass that saw the input change (passes every 1 ms).
        IReadOnlyList<Frame> frames = rig.Sink.Frames;
        Assert.Equal(3_001_000, frames.SingleEvent(EventKind.BrakeOn).TimeMicros);
        Assert.Equal(3_201_000, frames.SingleEvent(EventKind.Mark).TimeMicros);
        Assert.Equal(3_501_000, frames.SingleEvent(EventKind.BrakeOff).TimeMicros);

        // The switch's events say when the pass before read the old level: a change within 1 ms before.
        Assert.Equal(1_000, frames.SingleEvent(EventKind.BrakeOn).ReadGapMicros);
        Assert.Equal(1_000, frames.SingleEvent(EventKind.BrakeOff).ReadGapMicros);
    }

    [Fact]
    public void ADebouncedSwitchIsDatedToThePassThatFirstSawIt()
    {
        // Boards take a new level only after it held 20 ms (contact bounce); the event still
        // carries the first pass that read it, and the gap from the pass before.
        var rig = new Rig(MotionProfile.Launch(2.5, HalfG));
        rig.Loop.SwitchHoldMicros = 20_000;
        rig.RunTo(3_000_000);
        rig.Brake.Active = true;
        rig.RunTo(3_005_000);
        rig.Brake.Active = false; // a bounce: open again for 3 ms
        rig.RunTo(3_008_000);
        rig.Brake.Active = true;
        rig.RunTo(3_020_000);
        Assert.Empty(rig.Sink.Frames.Events(EventKind.BrakeOn));
        rig.RunTo(3_100_000);
        rig.Mark.Active = true;
        rig.RunTo(3_110_000);
        rig.Mark.Active = false; // a 10 ms touch is no press
        rig.RunTo(3_200_000);
        rig.Recorder.Shutdown(3_200_000);

        EventFrame on = rig.Sink.Frames.SingleEvent(EventKind.BrakeOn);
        Assert.Equal(3_009_000, on.TimeMicros);
        Assert.Equal(1_000, on.ReadGapMicros);
        Assert.Empty(rig.Sink.Frames.Events(EventKind.Mark));
        Assert.Throws<ArgumentOutOfRangeException>(() => { rig.Loop.SwitchHoldMicros = -1; });
    }

    [Fact]
    public void AClockWrapDuringARunKeepsTimesContinuous()
    {
        // The 32-bit counter rolls over about 3 s after power-up, in the middle of the run.
        ulong start = uint.MaxValue - 3_000_000UL;
        var rig = new Rig(MotionProfile.LaunchAndStop(2.5, HalfG, 4.0, 0.8 * MotionProfile.G0), start);
        rig.RunTo(7_500_000);

        Assert.Equal(1, rig.Health.ClockWraps);
        IReadOnlyList<Frame> frames = rig.Sink.Frames;
        var observations = frames.Observations(0, 0);
        Assert.True(observations[^1].HiMicros > uint.MaxValue);
        Assert.All(observations.Zip(observations.Skip(1)), p => Assert.True(p.Second.HiMicros > p.First.HiMicros));
        Assert.Equal(1, Assert.IsType<HealthFrame>(frames[^2]).Counters[0]);
        Assert.Equal(observations.Count, ((SummaryFrame)frames[^1]).ObservationsWritten);
    }

    [Fact]
    public void MissingPartsAreRejectedAndOptionalPartsMayBeNull()
    {
        var counter = new FakeMicrosecondCounter();
        var clock = new MonotonicClock(counter, null!);
        var recorder = new RunRecorder(new LoggerSettings { AccelPresent = false }, new MemorySink(), null!);
        var source = new EdgeObservationQueue(8, null!);
        Assert.Throws<ArgumentNullException>(() => new CaptureLoop(null!, source, null!, null!, null!, null!, recorder, 32, 20_000));
        Assert.Throws<ArgumentNullException>(() => new CaptureLoop(clock, null!, null!, null!, null!, null!, recorder, 32, 20_000));
        Assert.Throws<ArgumentNullException>(() => new CaptureLoop(clock, source, null!, null!, null!, null!, null!, 32, 20_000));
        Assert.Throws<ArgumentOutOfRangeException>(() => new CaptureLoop(clock, source, null!, null!, null!, null!, recorder, 0, 20_000));

        // A bare loop (queue source, no accelerometer, inputs or indicator) still runs a launch.
        var loop = new CaptureLoop(clock, source, null!, null!, null!, null!, recorder, 32, 20_000);
        recorder.SetCounterOrigin(0, 0);
        for (int ms = 1; ms <= 1500; ms++)
        {
            counter.TrueMicros = (ulong)ms * 1000;
            if (ms > 1200 && ms % 10 == 0)
            {
                source.TryWriteEdge(0, (ms - 1200) / 10, ms * 1000L);
            }

            loop.Step();
        }

        Assert.Equal(RunPhase.RolledOut, recorder.Phase);
    }

    /// <summary>The box on the bench: a fake counter clock, a polled pulse counter following the
    /// motion profile, an accelerometer with a 64-sample FIFO read every 20 ms, brake switch, mark
    /// button and indicator, stepped once per millisecond.</summary>
    private sealed class Rig
    {
        private readonly MotionProfile profile;
        private readonly PolledPulseSource source;
        private readonly CaptureLoop loop;
        private readonly double metresPerPulse;
        private readonly ulong start;

        public Rig(MotionProfile profile, ulong start = 0)
        {
            this.profile = profile;
            this.start = start;
            Counter = new FakeMicrosecondCounter(start);
            var settings = new LoggerSettings();
            metresPerPulse = settings.CircumferenceMicrometres * 1e-6 / settings.PulsesPerRevolution;
            var clock = new MonotonicClock(Counter, Health);
            Recorder = new RunRecorder(settings, Sink, Health);
            Accelerometer = new FakeAccelerometer(Counter, (long)start, 1000, 64, t =>
                new AccelSample((short)Math.Round(profile.AccelAt((t - (long)start) / 1e6) / MotionProfile.G0 * 1000), 0, 1000));
            source = new PolledPulseSource(Pulses, clock);
            Recorder.SetCounterOrigin(0, Pulses[0]);
            loop = new CaptureLoop(clock, source, Accelerometer, Brake, Mark, Indicator, Recorder, 64, 20_000);
        }

        public FakeMicrosecondCounter Counter { get; }

        public CaptureLoop Loop => loop;

        public HealthCounters Health { get; } = new();

        public FakePulseCounter Pulses { get; } = new(1);

        public FakeAccelerometer Accelerometer { get; }

        public FakeDigitalInput Brake { get; } = new();

        public FakeDigitalInput Mark { get; } = new();

        public RecordingIndicator Indicator { get; } = new();

        public MemorySink Sink { get; } = new();

        public RunRecorder Recorder { get; }

        /// <summary>Steps the loop every millisecond until <paramref name="micros"/> after power-up.</summary>
        public void RunTo(long micros)
        {
            ulong end = start + (ulong)micros;
            while (Counter.TrueMicros + 1000 <= end)
            {
                Counter.TrueMicros += 1000;
                double s = (Counter.TrueMicros - start) / 1e6;
                Pulses[0] = (long)Math.Floor((profile.DistanceAt(s) / metresPerPulse) + 1e-9);
                source.Poll();
                loop.Step();
            }
        }
    }
}
