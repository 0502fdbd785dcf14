using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>The run state machine's rules at their edges, fed by hand sample by sample and pulse by
/// pulse: each threshold and timer at exactly its value and one step short of it, every axis and
/// direction of the stillness band, the frame fields that only differ on a second run or a second
/// channel. Expected values are worked out by hand in the comments (integer µs, mg, µm).</summary>
/// <remarks>The still test works on blocks of 50 samples (the default 50 ms at 1 kHz), counted
/// from the first sample after power-up, a pulse or a gap: fed from 1 ms, the blocks are
/// 1–50 ms, 51–100 ms, … and the test is made at each block's last sample.</remarks>
public class RunRecorderRuleTests
{
    // The default accelerometer samples at 1 kHz: one sample per 1000 µs.
    private const long Ms = 1000;

    private static readonly (short X, short Y, short Z) Level = (0, 0, 1000);

    [Fact]
    public void StagingNeedsTheFullStillHoldAndNotOneSampleLess()
    {
        var box = new Box(new LoggerSettings());

        // Still from the first sample at 1 ms: the first block end a full second later is the
        // 21st block's, 1 050 ms (the 20th ends at 1 000 ms, 999 ms after the window opened).
        box.Feed(Ms, 1_049_000, _ => Level);
        Assert.Equal(RunPhase.Idle, box.Recorder.Phase);
        box.Feed(1_050_000, 1_050_000, _ => Level);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        Assert.Equal((0, 0, 1000), (box.Recorder.RestX, box.Recorder.RestY, box.Recorder.RestZ));
    }

    [Fact]
    public void TheRestingVectorIsTheMeanOfTheStillWindowRoundedHalfAwayFromZero()
    {
        var box = new Box(new LoggerSettings());

        // Each axis alternates between two values 3 mg apart (inside the 60 mg band); x negative
        // so the rounding of a negative mean is exercised too.
        static (short, short, short) Wobble(long t) => (t / Ms) % 2 == 0 ? ((short)-100, (short)50, (short)1000) : ((short)-103, (short)53, (short)1001);
        box.Feed(Ms, 1_050_000, Wobble);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);

        // Staged at the end of the block 1 001–1 050 ms, which is not yet vouched for by a block
        // after it: the mean is over the 1000 samples from 1 ms to 1000 ms, 500 odd and 500 even.
        // Every axis' mean is a half: -101.5 → -102, 51.5 → 52, 1000.5 → 1001 (away from zero).
        const int n = 1000;
        double meanX = ((500 * -103.0) + (500 * -100.0)) / n;
        double meanY = ((500 * 53.0) + (500 * 50.0)) / n;
        double meanZ = ((500 * 1001.0) + (500 * 1000.0)) / n;
        Assert.Equal((int)Math.Round(meanX, MidpointRounding.AwayFromZero), box.Recorder.RestX);
        Assert.Equal((int)Math.Round(meanY, MidpointRounding.AwayFromZero), box.Recorder.RestY);
        Assert.Equal((int)Math.Round(meanZ, MidpointRounding.AwayFromZero), box.Recorder.RestZ);
        Assert.Equal((-102, 52, 1001), (box.Recorder.RestX, box.Recorder.RestY, box.Recorder.RestZ));

        // One-sample blocks and a 2 ms hold: staged at the third sample, the mean over the first
        // two, -101 and -102 → -101.5 → -102 (away from zero); +101.5 → +102.
        var halves = new Box(new LoggerSettings { StageHoldMicros = 2000, StillBlockMicros = 1000 });
        halves.Feed(Ms, 3 * Ms, t => t == Ms ? ((short)-101, (short)101, (short)1000) : ((short)-102, (short)102, (short)1001));
        Assert.Equal(RunPhase.Staged, halves.Recorder.Phase);
        Assert.Equal((-102, 102, 1001), (halves.Recorder.RestX, halves.Recorder.RestY, halves.Recorder.RestZ));
    }

    [Theory]
    [InlineData(0, 1)]
    [InlineData(0, -1)]
    [InlineData(1, 1)]
    [InlineData(1, -1)]
    [InlineData(2, 1)]
    [InlineData(2, -1)]
    public void ASpreadOfExactlyTheBandIsStillOneMoreRestartsTheHold(int axis, int direction)
    {
        var settings = new LoggerSettings();
        int band = settings.StillBandMilliG;

        // From 501 ms (a block's first sample) the axis sits exactly one band away from where it
        // started: the block means are a band apart, still.
        var exact = new Box(settings);
        exact.Feed(Ms, 1_050_000, t => Offset(axis, t > 500_000 ? direction * band : 0));
        Assert.Equal(RunPhase.Staged, exact.Recorder.Phase);

        // From 601 ms it moves 1 mg past the start on the other side: the block 601–650 ms lies
        // band + 1 from the one before, so the hold starts again at 601 ms and staging comes at the
        // end of the block 1 601–1 650 ms.
        var past = new Box(settings);
        past.Feed(Ms, 1_649_000, t => Offset(axis, t > 600_000 ? -direction : t > 500_000 ? direction * band : 0));
        Assert.Equal(RunPhase.Idle, past.Recorder.Phase);
        past.Feed(1_650_000, 1_650_000, _ => Offset(axis, -direction));
        Assert.Equal(RunPhase.Staged, past.Recorder.Phase);
    }

    [Fact]
    public void AnAccelerometerGapRestartsTheHold()
    {
        // The blocks start again at 501 ms: staged at the end of the block 1 501–1 550 ms.
        var box = new Box(new LoggerSettings());
        box.Feed(Ms, 500_000, _ => Level);
        box.Recorder.OnAccelGap(3, 500_500);
        box.Feed(501_000, 1_549_000, _ => Level);
        Assert.Equal(RunPhase.Idle, box.Recorder.Phase);
        box.Feed(1_550_000, 1_550_000, _ => Level);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
    }

    [Fact]
    public void APulseRestartsTheHoldFromTheNextSampleEvenOneStampedAtThePulse()
    {
        var box = new Box(new LoggerSettings());
        box.Recorder.SetCounterOrigin(0, 0);
        box.Feed(Ms, 500_000, _ => Level);

        // One tooth rolls by (far short of the unstaged-run distance); its bracket ends exactly
        // when the next sample is taken, which may start the new still window: its first block
        // is 501–550 ms, staging at the end of the block 1 501–1 550 ms.
        box.Recorder.OnPulse(0, 1, 500_990, 501_000);
        box.Feed(501_000, 1_549_000, _ => Level);
        Assert.Equal(RunPhase.Idle, box.Recorder.Phase);
        box.Feed(1_550_000, 1_550_000, _ => Level);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        Assert.Empty(box.Sink.Bytes);
    }

    [Fact]
    public void WhileStagedTheRestingVectorFollowsANewStillWindowOnceItLastsTheHold()
    {
        var box = new Box(new LoggerSettings());
        box.Feed(Ms, 1_050_000, _ => Level);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);

        // From 1.201 s (a block's first sample) the car sits 70 mg lower on z (someone sat in
        // it): its first block is 70 mg from the window's, a new still window. Its mean replaces
        // the resting vector at the first block end a hold later, 2.25 s (2.2 s is 999 ms on).
        box.Feed(1_051_000, 2_249_000, t => t > 1_200_000 ? ((short)0, (short)0, (short)1070) : Level);
        Assert.Equal(1000, box.Recorder.RestZ);
        box.Feed(2_250_000, 2_250_000, _ => ((short)0, (short)0, (short)1070));
        Assert.Equal(1070, box.Recorder.RestZ);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);

        // The launch reports that vector and its 1000 vouched samples (1.201 s to 2.2 s; the
        // block that ends at 2.25 s is the window's latest, vouched for by none after it).
        box.Feed(2_251_000, 2_300_000, t => ((short)300, (short)0, (short)1070));
        EventFrame staged = box.Sink.Frames.SingleEvent(EventKind.Staged);
        Assert.Equal((0L, 0L, 1070L), (staged.StagedX!.Value, staged.StagedY!.Value, staged.StagedZ!.Value));
        Assert.Equal(1000, staged.StagedSamples);
    }

    [Fact]
    public void AForwardAverageOfExactlyTheThresholdOpensTheRunAtTheOldestSampleOfTheWindow()
    {
        // The default threshold, inside the still band: the launch's samples do not move the
        // resting vector all the same, as the block holding them is the window's latest, vouched
        // for only by the block after it, and the run opens before that one ends.
        var settings = new LoggerSettings();
        int threshold = settings.MotionThresholdMilliG;
        int n = RunRecorder.OnsetWindowSamples(settings);
        Assert.Equal(RunRecorder.StillBlockSamples(settings), n); // 50 at 1 kHz, more than the 16 confirm samples
        Assert.True(threshold < settings.StillBandMilliG);

        // One mg short for as long as you like: no run.
        var below = new Box(settings);
        below.Feed(Ms, 1_050_000, _ => Level);
        below.Feed(1_051_000, 3_000_000, _ => ((short)(threshold - 1), (short)0, (short)1000));
        Assert.Equal(RunPhase.Staged, below.Recorder.Phase);

        // Exactly the threshold from 1.1 s: the run opens at the n-th such sample, and first
        // motion is the oldest sample of the window, 1.1 s itself.
        var at = new Box(settings);
        at.Feed(Ms, 1_050_000, _ => Level);
        at.Feed(1_051_000, 1_100_000 + ((n - 2) * Ms), t => t >= 1_100_000 ? ((short)threshold, (short)0, (short)1000) : Level);
        Assert.Equal(RunPhase.Staged, at.Recorder.Phase);
        at.Feed(1_100_000 + ((n - 1) * Ms), 1_100_000 + ((n - 1) * Ms), _ => ((short)threshold, (short)0, (short)1000));
        Assert.Equal(RunPhase.Moving, at.Recorder.Phase);
        EventFrame motion = at.Sink.Frames.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.AccelOnset, motion.Cause);
        Assert.Equal(1_100_000, motion.TimeMicros);
        Assert.Equal(1_100_000, at.Recorder.MotionMicros);
    }

    [Theory]
    [InlineData(0, false)]
    [InlineData(1, true)]
    [InlineData(2, false)]
    [InlineData(2, true)]
    public void TheForwardAxisAndItsSignPickWhichDeviationFromRestIsALaunch(int forwardAxis, bool reversed)
    {
        var settings = new LoggerSettings { ForwardAxis = forwardAxis, ForwardAxisReversed = reversed };

        // The box is tilted: 100 mg rests on x and 200 on y, 980 on z.
        short[] rest = { 100, 200, 980 };
        var box = new Box(settings);
        box.Feed(Ms, 1_500_000, _ => (rest[0], rest[1], rest[2]));
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        Assert.Equal((100, 200, 980), (box.Recorder.RestX, box.Recorder.RestY, box.Recorder.RestZ));

        // 150 mg the wrong way along the forward axis (rolling back): no run.
        int sign = reversed ? -1 : 1;
        short[] back = (short[])rest.Clone();
        back[forwardAxis] = (short)(rest[forwardAxis] - (sign * 150));
        box.Feed(1_501_000, 1_600_000, _ => (back[0], back[1], back[2]));
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);

        // 150 mg forward from 1.7 s: a run whose first motion is 1.7 s.
        short[] ahead = (short[])rest.Clone();
        ahead[forwardAxis] = (short)(rest[forwardAxis] + (sign * 150));
        box.Feed(1_601_000, 1_800_000, t => t >= 1_700_000 ? (ahead[0], ahead[1], ahead[2]) : (rest[0], rest[1], rest[2]));
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);
        IReadOnlyList<Frame> frames = box.Sink.Frames;
        Assert.Equal(1_700_000, frames.SingleEvent(EventKind.Motion).TimeMicros);
        var config = (ConfigurationFrame)frames[0];
        Assert.Equal(forwardAxis, config.ForwardAxis);
        Assert.Equal(reversed ? 1 : 0, config.ForwardSign);
    }

    [Fact]
    public void WithPulsesOnlyStagingComesExactlyOneHoldAfterTheLastPulse()
    {
        var settings = new LoggerSettings { AccelPresent = false };
        var box = new Box(settings);
        box.Recorder.SetCounterOrigin(0, 0);
        box.Recorder.OnPulse(0, 1, 99_990, 100_000);
        box.Recorder.Tick(100_000 + settings.StageHoldMicros - 1);
        Assert.Equal(RunPhase.Idle, box.Recorder.Phase);
        box.Recorder.Tick(100_000 + settings.StageHoldMicros);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);

        box.Recorder.OnPulse(0, 2, 3_000_000, 3_000_010);
        EventFrame staged = box.Sink.Frames.SingleEvent(EventKind.Staged);
        Assert.Equal(100_000, staged.TimeMicros);
        Assert.Equal(0, ((ConfigurationFrame)box.Sink.Frames[0]).AccelFullScaleMilliG);
    }

    [Fact]
    public void HealthAndStopComeExactlyOnTheirIntervalsAndTheNextStagingDatesFromTheLastPulse()
    {
        var settings = new LoggerSettings { AccelPresent = false };
        var box = new Box(settings);
        box.Recorder.SetCounterOrigin(0, 0);
        box.Recorder.Tick(1_000_000);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);

        // Ten pulses 10 ms apart from 2 s; the run opens at the first bracket's end.
        for (int k = 1; k <= 10; k++)
        {
            box.Recorder.OnPulse(0, k, 2_000_000 + (k * 10_000) - 5, 2_000_000 + (k * 10_000));
        }

        long opened = 2_010_000;
        long lastHi = 2_100_000;
        box.Recorder.Tick(opened + settings.HealthIntervalMicros - 1);
        Assert.Empty(box.Sink.Frames.OfType<HealthFrame>());
        box.Recorder.Tick(opened + settings.HealthIntervalMicros);
        Assert.Equal(opened + settings.HealthIntervalMicros, Assert.Single(box.Sink.Frames.OfType<HealthFrame>()).TimeMicros);

        box.Recorder.Tick(lastHi + settings.StopHoldMicros - 1);
        Assert.NotEqual(RunPhase.Stopped, box.Recorder.Phase);
        box.Recorder.Tick(lastHi + settings.StopHoldMicros);
        Assert.Equal(RunPhase.Stopped, box.Recorder.Phase);
        Assert.Equal(lastHi, box.Sink.Frames.SingleEvent(EventKind.Stopped).TimeMicros);

        // The car has been still since the last pulse, longer than the staging hold already.
        box.Recorder.Tick(lastHi + settings.StopHoldMicros + 1);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        box.Recorder.OnPulse(0, 11, 9_000_000, 9_000_010);
        Assert.Equal(lastHi, box.Sink.Frames.Events(EventKind.Staged).Last().TimeMicros);
        Assert.Equal(box.Sink.Frames.Count, box.Recorder.FramesWritten);
    }

    [Fact]
    public void AfterAShutdownStagingWaitsAHoldFromTheShutdownNotFromTheLastPulse()
    {
        var settings = new LoggerSettings { AccelPresent = false };
        var box = new Box(settings);
        box.Recorder.SetCounterOrigin(0, 0);
        box.Recorder.Tick(1_000_000);
        box.Recorder.OnPulse(0, 1, 2_000_000, 2_000_010);
        box.Recorder.OnPulse(0, 2, 2_010_000, 2_010_010);
        box.Recorder.Shutdown(2_500_000);
        Assert.Equal(RunPhase.Stopped, box.Recorder.Phase);

        box.Recorder.Tick(2_500_000 + settings.StageHoldMicros - 1);
        Assert.Equal(RunPhase.Stopped, box.Recorder.Phase);
        box.Recorder.Tick(2_500_000 + settings.StageHoldMicros);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
    }

    [Fact]
    public void TheRolloutMarkAtExactlyOneToothAndItsSpeed()
    {
        // 4 teeth on a 1.2192 m tyre: one tooth is exactly the 304 800 µm rollout.
        var settings = new LoggerSettings { AccelPresent = false, PulsesPerRevolution = 4, CircumferenceMicrometres = 1_219_200 };

        // A zero-width bracket: the mark is the first edge itself, and with no time between
        // the two midpoints there is no speed to give (0).
        var sharp = new Box(settings);
        sharp.Recorder.SetCounterOrigin(0, 0);
        sharp.Recorder.Tick(1_000_000);
        sharp.Recorder.OnPulse(0, 1, 2_000_000, 2_000_000);
        Assert.Equal(RunPhase.RolledOut, sharp.Recorder.Phase);
        EventFrame rollout = sharp.Sink.Frames.SingleEvent(EventKind.Rollout);
        Assert.Equal(2_000_000, rollout.TimeMicros);
        Assert.Equal(0, rollout.SpeedMillimetresPerSecond);

        // A 400 µs bracket: first motion is its start (2.0 s), the mark its midpoint (2.0002 s),
        // and the speed one tooth over those 200 µs: 304.8 mm / 0.2 ms = 1 524 000 mm/s.
        var wide = new Box(settings);
        wide.Recorder.SetCounterOrigin(0, 0);
        wide.Recorder.Tick(1_000_000);
        wide.Recorder.OnPulse(0, 1, 2_000_000, 2_000_400);
        rollout = wide.Sink.Frames.SingleEvent(EventKind.Rollout);
        Assert.Equal(2_000_200, rollout.TimeMicros);
        Assert.Equal(1_524_000, rollout.SpeedMillimetresPerSecond);
        Assert.Equal(2_000_200, wide.Recorder.RolloutMicros);
    }

    [Fact]
    public void TheRolloutMarkInterpolatesBetweenBracketMidpoints()
    {
        // 10 teeth on a 1.0 m tyre: 100 000 µm per tooth, rollout 304 800 µm is reached between
        // counts 3 and 4. Midpoints: count 3 at 2 030 100 µs, count 4 at 2 040 200 µs. The mark is
        // 2 030 100 + 10 100 × (304 800 − 300 000) / 100 000 = 2 030 100 + 484.8 → 2 030 584
        // (integer division); speed 100 mm over 10.1 ms = 9 900 mm/s (integer division).
        var settings = new LoggerSettings { AccelPresent = false, PulsesPerRevolution = 10, CircumferenceMicrometres = 1_000_000 };
        var box = new Box(settings);
        box.Recorder.SetCounterOrigin(0, 0);
        box.Recorder.Tick(1_000_000);
        box.Recorder.OnPulse(0, 1, 2_000_000, 2_000_200);
        box.Recorder.OnPulse(0, 2, 2_020_000, 2_020_200);
        box.Recorder.OnPulse(0, 3, 2_030_000, 2_030_200);
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);
        box.Recorder.OnPulse(0, 4, 2_040_000, 2_040_400);
        EventFrame rollout = box.Sink.Frames.SingleEvent(EventKind.Rollout);
        Assert.Equal(2_030_584, rollout.TimeMicros);
        Assert.Equal(9_900, rollout.SpeedMillimetresPerSecond);
    }

    [Fact]
    public void UnstagedRunsOpenAfterTheDistanceRolledFromWhereEachRollBegan()
    {
        // 4 teeth on a 1.2 m tyre: 300 000 µm per tooth; 3 m is exactly ten teeth. With an
        // accelerometer that never sends a sample the box is never staged.
        var settings = new LoggerSettings
        {
            PulsesPerRevolution = 4,
            CircumferenceMicrometres = 1_200_000,
            SecondChannelEnabled = true,
            SecondPulsesPerRevolution = 4,
            SecondCircumferenceMicrometres = 1_200_000,
        };
        var box = new Box(settings);
        box.Recorder.SetCounterOrigin(0, 5000);
        box.Recorder.SetCounterOrigin(1, 700);

        long t = 1_000_000;
        void Pulse(int channel, long count)
        {
            t += 10_000;
            box.Recorder.OnPulse(channel, count, t - 10, t);
        }

        for (long c = 5001; c <= 5009; c++)
        {
            Pulse(0, c);
            Pulse(1, c - 4300);
        }

        Assert.Equal(RunPhase.Idle, box.Recorder.Phase);
        Pulse(0, 5010);
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);
        var config = (ConfigurationFrame)box.Sink.Frames[0];
        Assert.Equal(5009, config.OriginCount);
        Assert.Empty(box.Sink.Frames.Events(EventKind.Staged));

        // The second channel keeps turning after the distance channel stops; the stop still
        // comes one hold after the distance channel's last pulse.
        for (long c = 710; c <= 714; c++)
        {
            Pulse(1, c);
        }

        long lastDistanceHi = 1_000_000 + (19 * 10_000);
        box.Recorder.Tick(lastDistanceHi + settings.StopHoldMicros);
        Assert.Equal(RunPhase.Stopped, box.Recorder.Phase);
        var first = box.Sink.Frames.OfType<SummaryFrame>().Single();
        Assert.Equal(lastDistanceHi, first.StoppedMicros);
        Assert.Equal(1, first.Channel0Count);
        Assert.Equal(5, first.Channel1Count);

        // A second roll: again ten teeth from where it began, not from the first roll's start.
        int framesBefore = box.Sink.Frames.Count;
        t = 10_000_000;
        for (long c = 5011; c <= 5019; c++)
        {
            Pulse(0, c);
        }

        Assert.Equal(RunPhase.Stopped, box.Recorder.Phase);
        Pulse(0, 5020);
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);
        box.Recorder.Shutdown(t + 1000);
        var second = box.Sink.Frames.Skip(framesBefore).ToList();
        Assert.Equal(2, ((ConfigurationFrame)second[0]).RunNumber);
        Assert.Equal(second.Count, ((SummaryFrame)second[^1]).FramesInRun);
        Assert.Empty(second.Events(EventKind.Staged));
    }

    [Fact]
    public void APulsesOnlyBoxIgnoresAccelerometerBurstsAndMakesItsOwnHealthCounters()
    {
        var settings = new LoggerSettings { AccelPresent = false };
        var sink = new MemorySink();
        var recorder = new RunRecorder(settings, sink, null!);
        Assert.NotNull(recorder.Health);
        recorder.SetCounterOrigin(0, 0);
        recorder.Tick(1_000_000);
        recorder.OnPulse(0, 1, 2_000_000, 2_000_000 + settings.BracketLimitMicros + 1);
        recorder.OnAccelBurst(new short[] { 9000, 0, 1000, 0, 0, 1000 }, 2, 0, 2_010_000);
        recorder.Shutdown(2_100_000);

        Assert.DoesNotContain(sink.Frames, f => f is AccelerationFrame);
        Assert.Equal(0, recorder.Health.AccelSamplesClipped);
        Assert.Equal(1, recorder.Health.WideBrackets);
        Assert.Equal(0, ((SummaryFrame)sink.Frames[^1]).AccelSamplesWritten);
    }

    [Fact]
    public void ABracketOfExactlyTheLimitIsNotWideAndARepeatedCountIsNotBackwards()
    {
        var settings = new LoggerSettings { AccelPresent = false };
        var box = new Box(settings);
        box.Recorder.SetCounterOrigin(0, 0);
        box.Recorder.OnPulse(0, 1, 1_000_000, 1_000_000 + settings.BracketLimitMicros);
        box.Recorder.OnPulse(0, 1, 1_010_000, 1_010_001);
        Assert.Equal(0, box.Health.WideBrackets);
        Assert.Equal(0, box.Health.CountsWentBackwards);
        Assert.Equal(settings.BracketLimitMicros, box.Health.WidestBracketMicros);
    }

    [Fact]
    public void PreTriggerSamplesGoOutAtMostTheSharePerTick()
    {
        var settings = new LoggerSettings { PreTriggerSamplesPerStep = 100 };
        var box = new Box(settings);
        box.Feed(Ms, 2_000_000, _ => Level, burst: 20);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        box.Feed(2_001_000, 2_040_000, t => t > 2_020_000 ? ((short)300, (short)0, (short)1000) : Level, burst: 20);
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);

        int Written() => box.Sink.Frames.OfType<AccelerationFrame>().Sum(a => a.Samples.Count);
        Assert.Equal(0, Written());
        box.Recorder.Tick(2_041_000);
        Assert.Equal(100, Written());
        box.Recorder.Tick(2_042_000);
        Assert.Equal(200, Written());
    }

    [Fact]
    public void SamplesWrittenDuringARunAreNotWrittenAgainAsTheNextRunsPreTrigger()
    {
        // A short staging hold, so that the second run's pre-trigger window (1.5 s) reaches back
        // across the shutdown into the first run.
        var settings = new LoggerSettings { StageHoldMicros = 200_000 };
        var box = new Box(settings);
        (short, short, short) Launch(long t) => ((short)300, (short)0, (short)1000);
        box.Feed(Ms, 300_000, _ => Level, burst: 20);
        box.Feed(300_000 + Ms, 1_000_000, Launch, burst: 20);
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);
        box.Recorder.Shutdown(1_000_000);
        long lastOfFirst = box.Sink.Frames.OfType<AccelerationFrame>().Max(a => a.FirstIndex + a.Samples.Count - 1);

        int framesBefore = box.Sink.Frames.Count;
        box.Feed(1_000_000 + Ms, 1_300_000, _ => Level, burst: 20);
        Assert.Equal(RunPhase.Staged, box.Recorder.Phase);
        box.Feed(1_300_000 + Ms, 1_400_000, Launch, burst: 20);
        Assert.Equal(RunPhase.Moving, box.Recorder.Phase);
        var second = box.Sink.Frames.Skip(framesBefore).OfType<AccelerationFrame>().ToList();
        Assert.True(second[0].FirstIndex > lastOfFirst, $"second run starts at sample {second[0].FirstIndex}, the first run wrote up to {lastOfFirst}");
    }

    private static (short X, short Y, short Z) Offset(int axis, int by) =>
        ((short)(Level.X + (axis == 0 ? by : 0)), (short)(Level.Y + (axis == 1 ? by : 0)), (short)(Level.Z + (axis == 2 ? by : 0)));

    /// <summary>A recorder with its sink and counters, fed 1 kHz samples by hand.</summary>
    private sealed class Box
    {
        private long index;

        public Box(LoggerSettings settings)
        {
            (Recorder, Sink, Health) = ScriptedRun.NewRecorder(settings);
        }

        public RunRecorder Recorder { get; }

        public MemorySink Sink { get; }

        public HealthCounters Health { get; }

        /// <summary>Samples at every whole millisecond from <paramref name="fromMicros"/> to
        /// <paramref name="toMicros"/> (both included), <paramref name="burst"/> to a FIFO read,
        /// each read at its last sample's time.</summary>
        public void Feed(long fromMicros, long toMicros, Func<long, (short X, short Y, short Z)> at, int burst = 1)
        {
            var buffer = new short[burst * 3];
            for (long t = fromMicros; t <= toMicros;)
            {
                int n = 0;
                long first = index;
                long read = t;
                for (; n < burst && t <= toMicros; n++, t += Ms)
                {
                    (short x, short y, short z) = at(t);
                    buffer[n * 3] = x;
                    buffer[(n * 3) + 1] = y;
                    buffer[(n * 3) + 2] = z;
                    read = t;
                }

                index += n;
                Recorder.OnAccelBurst(buffer, n, first, read);
            }
        }
    }
}
