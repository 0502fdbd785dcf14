using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

public class RunRecorderTests
{
    private const double HalfG = 0.5 * MotionProfile.G0;
    private const double BrakeDecel = 0.8 * MotionProfile.G0;

    private static LoggerSettings PulsesOnly() => new() { AccelPresent = false };

    [Fact]
    public void StagedLaunchWithPulsesOnly()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, health) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 4.0, BrakeDecel));

        run.RunUntil(1_900_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Empty(sink.Bytes);

        run.RunUntil(10_000_000);
        IReadOnlyList<Frame> frames = sink.Frames;
        PulseObservation first = run.Fed[0];

        var config = Assert.IsType<ConfigurationFrame>(frames[0]);
        Assert.Equal(LogFormat.Version, config.FormatVersion);
        Assert.Equal((FirmwareVersion.Major, FirmwareVersion.Minor, FirmwareVersion.Patch), ((byte)config.FirmwareMajor, (byte)config.FirmwareMinor, (byte)config.FirmwarePatch));
        Assert.Equal(1, config.RunNumber);
        Assert.Equal(first.HiMicros, config.OpenedMicros);
        Assert.Equal(0, config.OriginCount);
        Assert.Equal(LogFormat.ConfigFlagStaged, config.Flags);
        Assert.Equal(settings.PulsesPerRevolution, config.PulsesPerRevolution);
        Assert.Equal(settings.CircumferenceMicrometres, config.CircumferenceMicrometres);
        Assert.Null(config.SecondPulsesPerRevolution);
        Assert.Equal(settings.RolloutMicrometres, config.RolloutMicrometres);
        Assert.Equal(0, config.AccelRateMilliHz);
        Assert.Equal(0, config.PreTriggerSamples);
        Assert.Equal(settings.StageHoldMicros, config.StageHoldMicros);
        Assert.Equal(settings.StopHoldMicros, config.StopHoldMicros);
        Assert.Equal(settings.BracketLimitMicros, config.BracketLimitMicros);
        Assert.Equal(settings.StillBlockMicros, config.StillBlockMicros);

        // Without an accelerometer staging happens on time alone, with no gravity vector.
        var staged = Assert.IsType<EventFrame>(frames[1]);
        Assert.Equal(EventKind.Staged, staged.Kind);
        Assert.Equal((0L, 0L, 0L, 0L), (staged.StagedX!.Value, staged.StagedY!.Value, staged.StagedZ!.Value, staged.StagedSamples!.Value));

        var motion = Assert.IsType<EventFrame>(frames[2]);
        Assert.Equal(EventKind.Motion, motion.Kind);
        Assert.Equal(MotionCause.PulseCount, motion.Cause);
        Assert.Equal(first.LoMicros, motion.TimeMicros);
        Assert.DoesNotContain(frames, f => f is AccelerationFrame);

        Assert.Equal(run.Fed.Select(o => new DecodedObservation(0, o.Count, o.LoMicros, o.HiMicros)), frames.Observations(0, config.OriginCount));
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Equal(1, recorder.RunNumber);
        Assert.Equal(0, health.CountsWentBackwards);
    }

    [Theory]
    [InlineData(25_000)]
    [InlineData(80_000)]
    public void TheConfigurationCarriesTheStillBlockLength(int blockMicros)
    {
        // LOG-FORMAT.md 0x01: the still test's block length is the configuration's last field, so
        // the host knows what the still band was applied to.
        var settings = new LoggerSettings { StillBlockMicros = blockMicros };
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.5005, HalfG, 4.0, BrakeDecel));

        run.RunUntil(3_000_000);

        var config = Assert.IsType<ConfigurationFrame>(sink.Frames[0]);
        Assert.Equal(blockMicros, config.StillBlockMicros);
        var staged = (EventFrame)sink.Frames[1];
        Assert.Equal(0, staged.StagedSamples!.Value % RunRecorder.StillBlockSamples(settings));
    }

    [Fact]
    public void StagedLaunchWithAccelerometerOnsetBeforeTheFirstPulse()
    {
        var settings = new LoggerSettings();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        const double launchS = 2.5005;
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(launchS, HalfG, 4.0, BrakeDecel));

        run.RunUntil(2_400_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Empty(sink.Bytes);

        run.RunUntil(2_560_000);
        Assert.Equal(RunPhase.Moving, recorder.Phase);
        run.RunUntil(3_000_000);
        IReadOnlyList<Frame> frames = sink.Frames;
        var config = Assert.IsType<ConfigurationFrame>(frames[0]);
        Assert.Equal(LogFormat.ConfigFlagStaged | LogFormat.ConfigFlagAccelerometer, config.Flags);
        Assert.Equal(settings.AccelOutputDataRateMilliHz, config.AccelRateMilliHz);
        Assert.Equal(settings.AccelFullScaleMilliG, config.AccelFullScaleMilliG);
        Assert.Equal(settings.PreTriggerSamples, config.PreTriggerSamples);

        // Still from the first sample (1 ms) to the last sample before launch; resting vector +1 g
        // on z, the mean of the still test's whole blocks before the launch but the latest (not
        // yet vouched for by a block after it).
        long firstMovingSampleMicros = (long)Math.Ceiling(launchS * 1000) * 1000;
        int blockSamples = RunRecorder.StillBlockSamples(settings);
        long wholeBlocks = ((firstMovingSampleMicros - 1000) / 1000) / blockSamples;
        var staged = Assert.IsType<EventFrame>(frames[1]);
        Assert.Equal(EventKind.Staged, staged.Kind);
        Assert.Equal(1000, staged.TimeMicros);
        Assert.Equal((0L, 0L, 1000L), (staged.StagedX!.Value, staged.StagedY!.Value, staged.StagedZ!.Value));
        Assert.Equal((wholeBlocks - 1) * blockSamples, staged.StagedSamples);

        int motionAt = frames.IndexOf(f => f is EventFrame { Kind: EventKind.Motion });
        var motion = (EventFrame)frames[motionAt];
        Assert.Equal(MotionCause.AccelOnset, motion.Cause);
        Assert.Equal(firstMovingSampleMicros, motion.TimeMicros);
        Assert.True(motion.TimeMicros < run.EdgeMicros(0, 1), "onset comes before the first pulse edge");

        // Between the staging event and the motion event: the pre-trigger ring, oldest first, with
        // contiguous indices, its original samples and read times, covering at least one second.
        var preTrigger = frames.Skip(2).Take(motionAt - 2).Select(f => Assert.IsType<AccelerationFrame>(f)).ToList();
        Assert.NotEmpty(preTrigger);
        long index = preTrigger[0].FirstIndex;
        foreach (AccelerationFrame a in preTrigger)
        {
            Assert.Equal(index, a.FirstIndex);
            for (int i = 0; i < a.Samples.Count; i++)
            {
                Assert.Equal(run.Samples[(int)(a.FirstIndex + i)].Sample, a.Samples[i]);
                Assert.Equal(run.Samples[(int)(a.FirstIndex + i)].ReadMicros, a.ReadMicros);
            }

            index += a.Samples.Count;
        }

        long lastIndex = index - 1;
        long samples = lastIndex - preTrigger[0].FirstIndex + 1;
        Assert.Equal(settings.PreTriggerSamples, samples);
        long firstSampleMicros = (preTrigger[0].FirstIndex + 1) * 1000;
        Assert.True(motion.TimeMicros - firstSampleMicros >= 1_000_000, "at least one second before first motion");
        Assert.Equal(config.OpenedMicros, preTrigger[^1].ReadMicros);
        Assert.Equal(config.OpenedMicros, run.Samples[(int)lastIndex].ReadMicros);

        // After the motion event every later burst is written whole, continuing the indices.
        var inRun = frames.Skip(motionAt + 1).OfType<AccelerationFrame>().ToList();
        Assert.Equal(lastIndex + 1, inRun[0].FirstIndex);
        Assert.Equal(run.Samples.Count, (int)(inRun[^1].FirstIndex + inRun[^1].Samples.Count));
    }

    [Fact]
    public void ALaunchTooGentleForTheAccelerometerOpensOnThePulse()
    {
        var settings = new LoggerSettings();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);

        // 0.02 g = 20 mg, below the 40 mg threshold.
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.0, 0.02 * MotionProfile.G0));
        run.RunUntil(5_000_000);
        EventFrame motion = sink.Frames.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.PulseCount, motion.Cause);
        Assert.Equal(run.Fed[0].LoMicros, motion.TimeMicros);
    }

    [Fact]
    public void StopAfterTheHoldTimeWritesStopHealthAndAMatchingSummary()
    {
        var settings = new LoggerSettings();
        var (recorder, sink, health) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.5005, HalfG, 4.0, BrakeDecel));
        run.RunUntil(12_000_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        var config = (ConfigurationFrame)frames[0];
        long lastHi = run.Fed[^1].HiMicros;
        EventFrame stopped = frames.SingleEvent(EventKind.Stopped);
        Assert.Equal(lastHi, stopped.TimeMicros);

        // Stopped, then a health frame at the closing tick, then the summary as the run's last frame.
        int summaryAt = frames.IndexOf(f => f is SummaryFrame);
        Assert.Equal(frames.Count - 1, summaryAt);
        var closingHealth = Assert.IsType<HealthFrame>(frames[summaryAt - 1]);
        Assert.Same(stopped, frames[summaryAt - 2]);
        long closedAfter = closingHealth.TimeMicros - lastHi;
        Assert.InRange(closedAfter, settings.StopHoldMicros, settings.StopHoldMicros + (ScriptedRun.BurstSamples * 1000) - 1);

        var summary = (SummaryFrame)frames[summaryAt];
        Assert.Equal(1, summary.RunNumber);
        Assert.Equal(config.OpenedMicros, summary.OpenedMicros);
        Assert.Equal(frames.SingleEvent(EventKind.Motion).TimeMicros, summary.MotionMicros);
        Assert.Equal(frames.SingleEvent(EventKind.Rollout).TimeMicros, summary.RolloutMicros);
        Assert.Equal(lastHi, summary.StoppedMicros);
        Assert.Equal(run.Fed[^1].Count, summary.Channel0Count);
        Assert.Equal(0, summary.Channel1Count);
        Assert.Equal(frames.OfType<PulsesFrame>().Sum(p => p.Observations.Count), summary.ObservationsWritten);
        Assert.Equal(run.Fed.Count, summary.ObservationsWritten);
        Assert.Equal(frames.OfType<AccelerationFrame>().Sum(a => a.Samples.Count), summary.AccelSamplesWritten);
        Assert.Equal(frames.Count, summary.FramesInRun);
        Assert.Equal(LogFormat.SummaryFlagStaged | LogFormat.SummaryFlagRolloutReached | LogFormat.SummaryFlagClosedByStop, summary.Flags);

        Assert.Equal(recorder.MotionMicros, summary.MotionMicros);
        Assert.Equal(recorder.RolloutMicros, summary.RolloutMicros);
        Assert.Equal(0, health.FramesRefused);

        // Still again after the stop: ready for the next launch.
        Assert.Equal(RunPhase.Staged, recorder.Phase);
    }

    [Fact]
    public void ShutdownClosesWithoutAStop()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.0, HalfG));
        run.RunUntil(2_200_000);
        recorder.Shutdown(2_200_500);

        IReadOnlyList<Frame> frames = sink.Frames;
        Assert.Empty(frames.Events(EventKind.Stopped));
        var summary = Assert.IsType<SummaryFrame>(frames[^1]);
        Assert.Equal(0, summary.StoppedMicros);
        Assert.Equal(0, summary.RolloutMicros);
        Assert.Equal(LogFormat.SummaryFlagStaged, summary.Flags);
        Assert.Equal(2_200_500, Assert.IsType<HealthFrame>(frames[^2]).TimeMicros);
        Assert.Equal(RunPhase.Stopped, recorder.Phase);
    }

    [Fact]
    public void BrakeSwitchAndManualMarkBecomeTimedEvents()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 4.0, BrakeDecel));

        // Before a run nothing is written, but the switch state is remembered.
        recorder.OnManualMark(1_000_000);
        recorder.OnBrakeSwitch(true, 1_100_000);
        run.RunUntil(1_500_000);
        Assert.Empty(sink.Bytes);
        recorder.OnBrakeSwitch(false, 1_500_000);

        run.RunUntil(3_000_000);
        recorder.OnManualMark(3_000_100);
        run.RunUntil(4_000_000);
        recorder.OnBrakeSwitch(true, 4_000_050);
        recorder.OnBrakeSwitch(true, 4_000_060);
        run.RunUntil(4_500_000);
        recorder.OnBrakeSwitch(false, 4_500_070);
        recorder.OnBrakeSwitch(false, 4_500_080);
        run.RunUntil(9_000_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        Assert.Equal(new long[] { 3_000_100 }, frames.Events(EventKind.Mark).Select(e => e.TimeMicros));
        Assert.Equal(new long[] { 4_000_050 }, frames.Events(EventKind.BrakeOn).Select(e => e.TimeMicros));
        Assert.Equal(new long[] { 4_500_070 }, frames.Events(EventKind.BrakeOff).Select(e => e.TimeMicros));

        // Without the loop's gap the events carry none (a reader takes the gap as not known).
        Assert.All(frames.Events(EventKind.BrakeOn).Concat(frames.Events(EventKind.BrakeOff)), e => Assert.Null(e.ReadGapMicros));
    }

    [Fact]
    public void TheSwitchReadingsGapIsWrittenWithItsEvent()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 4.0, BrakeDecel));
        run.RunUntil(4_000_000);
        recorder.OnBrakeSwitch(true, 4_000_050, 21_000);
        run.RunUntil(4_500_000);
        recorder.OnBrakeSwitch(false, 4_500_070, 0);
        run.RunUntil(9_000_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        Assert.Equal(21_000, frames.SingleEvent(EventKind.BrakeOn).ReadGapMicros);
        Assert.Null(frames.SingleEvent(EventKind.BrakeOff).ReadGapMicros);
    }

    [Fact]
    public void ABrakeHeldWhenTheRunOpensIsReportedAtTheOpening()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.0, HalfG));
        run.RunUntil(1_500_000);
        recorder.OnBrakeSwitch(true, 1_500_000);
        run.RunUntil(2_500_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        var config = (ConfigurationFrame)frames[0];
        int motionAt = frames.IndexOf(f => f is EventFrame { Kind: EventKind.Motion });
        var brakeOn = Assert.IsType<EventFrame>(frames[motionAt + 1]);
        Assert.Equal(EventKind.BrakeOn, brakeOn.Kind);
        Assert.Equal(config.OpenedMicros, brakeOn.TimeMicros);
    }

    [Fact]
    public void AnUnstagedRollingRunOpensOnlyAfterTheConfiguredDistance()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Cruise(10.0));

        // The first count whose distance reaches UnstagedOpenMicrometres (integer µm arithmetic).
        long openCount = ((long)settings.UnstagedOpenMicrometres * settings.PulsesPerRevolution + settings.CircumferenceMicrometres - 1) / settings.CircumferenceMicrometres;
        long before = (long)Math.Floor(run.EdgeMicros(0, openCount)) - 1;
        run.RunUntil(before);
        Assert.Equal(RunPhase.Idle, recorder.Phase);
        Assert.Empty(sink.Bytes);

        run.RunUntil(2_000_000);
        Assert.Equal(RunPhase.RolledOut, recorder.Phase);
        recorder.Shutdown(2_000_000);
        IReadOnlyList<Frame> frames = sink.Frames;
        var config = Assert.IsType<ConfigurationFrame>(frames[0]);
        Assert.Equal(0, config.Flags & LogFormat.ConfigFlagStaged);
        Assert.Equal(openCount - 1, config.OriginCount);
        Assert.Empty(frames.Events(EventKind.Staged));

        PulseObservation opening = run.Fed.Single(o => o.Count == openCount);
        EventFrame motion = frames.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.RollingDistance, motion.Cause);
        Assert.Equal(opening.LoMicros, motion.TimeMicros);
        Assert.Equal(opening.HiMicros, config.OpenedMicros);

        List<DecodedObservation> decoded = frames.Observations(0, config.OriginCount);
        Assert.Equal(1, decoded[0].Count - config.OriginCount);
        Assert.Equal(run.Fed.Where(o => o.Count >= openCount).Select(o => new DecodedObservation(0, o.Count, o.LoMicros, o.HiMicros)), decoded);
        Assert.Equal(0, Assert.IsType<SummaryFrame>(frames[^1]).Flags & LogFormat.SummaryFlagStaged);
    }

    [Fact]
    public void SecondChannelPulsesAppearInChannelOnePulseFrames()
    {
        var settings = new LoggerSettings { AccelPresent = false, SecondChannelEnabled = true, SecondPulsesPerRevolution = 40, SecondCircumferenceMicrometres = 1_950_000 };
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 4.0, BrakeDecel));
        run.RunUntil(9_000_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        var config = (ConfigurationFrame)frames[0];
        Assert.Equal(LogFormat.ConfigFlagStaged | LogFormat.ConfigFlagSecondChannel, config.Flags);
        Assert.Equal(40, config.SecondPulsesPerRevolution);
        Assert.Equal(1_950_000, config.SecondCircumferenceMicrometres);

        var fed1 = run.Fed.Where(o => o.Channel == 1 && o.HiMicros >= config.OpenedMicros).Select(o => new DecodedObservation(1, o.Count, o.LoMicros, o.HiMicros)).ToList();
        Assert.NotEmpty(fed1);
        Assert.Equal(fed1, frames.Observations(1, 0));
        Assert.Equal(run.Fed.Where(o => o.Channel == 0).Select(o => new DecodedObservation(0, o.Count, o.LoMicros, o.HiMicros)), frames.Observations(0, config.OriginCount));

        var summary = (SummaryFrame)frames[^1];
        Assert.Equal(run.Fed.Last(o => o.Channel == 1).Count, summary.Channel1Count);
        Assert.Equal(run.Fed.Count(o => o.HiMicros >= config.OpenedMicros), summary.ObservationsWritten);
    }

    [Theory]
    [InlineData(500)]
    [InlineData(5000)]
    public void PolledBracketsDecodeBackExactlyIncludingOverlaps(int pollMicros)
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, health) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 5.0, BrakeDecel)) { PollPeriodMicros = pollMicros, PollReadMicros = 3 };
        run.RunUntil(10_000_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        var config = (ConfigurationFrame)frames[0];
        List<DecodedObservation> decoded = frames.Observations(0, config.OriginCount);
        Assert.Equal(run.Fed.Select(o => new DecodedObservation(0, o.Count, o.LoMicros, o.HiMicros)), decoded);

        if (pollMicros == 5000)
        {
            // Changes in consecutive polls: each bracket starts at the previous poll's first clock
            // reading, 3 µs before that poll's bracket ends — the overlap the svarint lo delta is for.
            Assert.Contains(decoded.Zip(decoded.Skip(1)), p => p.Second.LoMicros == p.First.HiMicros - 3);
            Assert.Contains(decoded.Zip(decoded.Skip(1)), p => p.Second.Count - p.First.Count > 1);
            Assert.Equal(run.Fed.Count(o => o.HiMicros - o.LoMicros > settings.BracketLimitMicros), health.WideBrackets);
        }
        else
        {
            Assert.Equal(0, health.WideBrackets);
        }

        Assert.Equal(run.Fed.Max(o => o.HiMicros - o.LoMicros), health.WidestBracketMicros);
    }

    [Fact]
    public void PulseBatchesAreFlushedByAge()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        recorder.SetCounterOrigin(0, 0);
        recorder.Tick(1_000_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        recorder.OnPulse(0, 1, 1_100_000, 1_100_001);
        recorder.OnPulse(0, 2, 1_150_000, 1_150_001);
        int framesAfterOpening = sink.Frames.Count;

        recorder.Tick(1_100_001 + settings.PulseFrameMaxAgeMicros - 1);
        Assert.Equal(framesAfterOpening, sink.Frames.Count);

        recorder.Tick(1_100_001 + settings.PulseFrameMaxAgeMicros);
        var pulses = Assert.IsType<PulsesFrame>(sink.Frames[^1]);
        Assert.Equal(new[] { 1L, 2L }, pulses.Observations.Select(o => o.Count));
    }

    [Fact]
    public void FullBatchesAreWrittenWithinThePayloadLimit()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        recorder.SetCounterOrigin(0, 0);
        recorder.Tick(1_000_000);
        long t = 2_000_000_000_000;
        for (int n = 1; n <= 2000; n++)
        {
            // Large times and irregular widths make every observation several bytes long.
            t += 997 + (n % 13);
            recorder.OnPulse(0, n, t - 1 - (n % 50), t);
        }

        IReadOnlyList<Frame> frames = sink.Frames;
        var full = frames.OfType<PulsesFrame>().ToList();
        Assert.True(full.Count >= 2);
        Assert.All(frames, f => Assert.InRange(f.Payload.Length, LogFormat.MinPayloadBytes, LogFormat.MaxPayloadBytes));
        Assert.True(full[0].Payload.Length > LogFormat.MaxPayloadBytes - 40, "a batch is written when it is nearly full");
    }

    [Fact]
    public void WideBracketsBackwardCountsAndFifoGapsAreCountedAndLogged()
    {
        var settings = new LoggerSettings();
        var (recorder, sink, health) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.5005, HalfG));
        run.RunUntil(3_000_000);
        long lastCount = run.Fed[^1].Count;
        long t = run.Fed[^1].HiMicros;

        recorder.OnPulse(0, lastCount + 1, t + 10, t + 10 + settings.BracketLimitMicros + 500);
        recorder.OnPulse(0, lastCount - 3, t + 3000, t + 3001);
        recorder.OnPulse(0, lastCount + 1, t + 3100, t + 3101);
        recorder.OnAccelGap(37, t + 4000);
        recorder.OnAccelGap(-5, t + 5000);
        recorder.Shutdown(t + 6000);

        Assert.Equal(1, health.WideBrackets);
        Assert.Equal(settings.BracketLimitMicros + 500, health.WidestBracketMicros);
        Assert.Equal(1, health.CountsWentBackwards);

        IReadOnlyList<Frame> frames = sink.Frames;
        var config = (ConfigurationFrame)frames[0];
        List<DecodedObservation> decoded = frames.Observations(0, config.OriginCount);
        Assert.Equal(lastCount + 1, decoded[^1].Count);
        Assert.Equal(settings.BracketLimitMicros + 500, decoded[^1].HiMicros - decoded[^1].LoMicros);
        Assert.DoesNotContain(decoded, o => o.HiMicros == t + 3001);

        var gaps = frames.Events(EventKind.AccelGap).ToList();
        Assert.Equal(new long?[] { 37, 0 }, gaps.Select(g => g.LostSamples));
        Assert.Equal(new[] { t + 4000, t + 5000 }, gaps.Select(g => g.TimeMicros));
    }

    [Fact]
    public void ClippedSamplesAreCounted()
    {
        var settings = new LoggerSettings();
        var (recorder, _, health) = ScriptedRun.NewRecorder(settings);
        int clipped = 0;
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.5005, HalfG))
        {
            AccelModifier = (t, s) =>
            {
                // A few samples at or beyond ±full scale on one axis, and some just inside it.
                long k = t / 1000;
                if (k % 97 == 0)
                {
                    clipped++;
                    return s with { Y = (short)(k % 2 == 0 ? 8000 : -8000) };
                }

                if (k % 89 == 0)
                {
                    clipped++;
                    return s with { Z = 8100, X = 8000 };
                }

                return k % 83 == 0 ? s with { X = 7999, Y = -7999 } : s;
            },
        };
        run.RunUntil(4_000_000);
        Assert.True(clipped > 30);
        Assert.Equal(clipped, health.AccelSamplesClipped);
    }

    [Fact]
    public void HealthFramesCarryTheCountersPeriodicallyAndAtTheClose()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, health) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.0, HalfG));
        run.RunUntil(2_500_000);
        health.ClockWraps = 3;
        health.PulseObservationsDropped = 4;
        health.AccelReadFailures = 5;
        health.AccelFifoOverflows = 6;
        health.FramesRefused = 7;
        run.RunUntil(5_600_000);
        recorder.Shutdown(5_600_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        var config = (ConfigurationFrame)frames[0];
        var healthFrames = frames.OfType<HealthFrame>().ToList();

        // One per HealthIntervalMicros while open (ticks come every 20 ms), plus the closing one.
        Assert.Equal(4, healthFrames.Count);
        for (int i = 0; i < 3; i++)
        {
            long due = config.OpenedMicros + ((i + 1) * (long)settings.HealthIntervalMicros);
            Assert.InRange(healthFrames[i].TimeMicros, due, due + 20_000 * (i + 1));
        }

        HealthFrame last = healthFrames[^1];
        Assert.Equal(LogFormat.HealthCounterCount, last.Counters.Count);
        Assert.Equal(Enumerable.Range(0, LogFormat.HealthCounterCount).Select(health.Get), last.Counters);
        Assert.Equal(new long[] { 3, 4, 5, 6 }, last.Counters.Take(4));
        Assert.Equal(7, last.Counters[7]);
        Assert.Equal(1, last.Counters[5]);
    }

    [Fact]
    public void TheFirstReadingOfAChannelOnlySetsWhereTheCounterStands()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        recorder.Tick(1_000_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        recorder.OnPulse(0, 5000, 1_100_000, 1_100_001);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Empty(sink.Bytes);

        recorder.OnPulse(0, 5001, 1_200_000, 1_200_001);
        Assert.Equal(RunPhase.Moving, recorder.Phase);
        Assert.Equal(5000, ((ConfigurationFrame)sink.Frames[0]).OriginCount);
    }

    [Fact]
    public void AnUnknownChannelIsACallerBug()
    {
        var (recorder, _, _) = ScriptedRun.NewRecorder(PulsesOnly());
        Assert.Throws<ArgumentOutOfRangeException>(() => recorder.OnPulse(1, 1, 0, 1));
    }

    [Fact]
    public void RunNumbersCountUpAcrossRuns()
    {
        LoggerSettings settings = PulsesOnly();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        recorder.SetCounterOrigin(0, 0);
        long count = 0;
        for (int runIndex = 0; runIndex < 3; runIndex++)
        {
            long t0 = 10_000_000L * (runIndex + 1);
            recorder.Tick(t0);
            Assert.Equal(runIndex == 0 ? RunPhase.Staged : RunPhase.Staged, recorder.Phase);
            for (int k = 0; k < 20; k++)
            {
                count++;
                recorder.OnPulse(0, count, t0 + 10_000 * (k + 1) - 1, t0 + 10_000 * (k + 1));
            }

            recorder.Tick(t0 + 3_000_000);
            Assert.Equal(RunPhase.Stopped, recorder.Phase);
        }

        var configs = sink.Frames.OfType<ConfigurationFrame>().ToList();
        Assert.Equal(new long[] { 1, 2, 3 }, configs.Select(c => c.RunNumber));
        Assert.Equal(new long[] { 0, 20, 40 }, configs.Select(c => c.OriginCount));
        Assert.Equal(new long[] { 1, 2, 3 }, sink.Frames.OfType<SummaryFrame>().Select(s => s.RunNumber));
        Assert.All(sink.Frames.OfType<SummaryFrame>(), s => Assert.Equal(20, s.Channel0Count));
    }

    [Fact]
    public void ASecondLaunchAfterAStopIsAFreshRunWithItsOwnStagingAndPreTrigger()
    {
        var settings = new LoggerSettings();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var profile = new MotionProfile(0, (2.5005, HalfG), (4.0, -BrakeDecel), (10.0005, HalfG));
        var run = new ScriptedRun(recorder, settings, profile);
        run.RunUntil(11_000_000);
        recorder.Shutdown(11_000_000);

        IReadOnlyList<Frame> frames = sink.Frames;
        var configs = frames.OfType<ConfigurationFrame>().ToList();
        Assert.Equal(new long[] { 1, 2 }, configs.Select(c => c.RunNumber));
        var summaries = frames.OfType<SummaryFrame>().ToList();
        Assert.Equal(2, summaries.Count);
        Assert.Equal(summaries[0].Channel0Count, configs[1].OriginCount);

        int secondAt = frames.IndexOf(f => f is ConfigurationFrame { RunNumber: 2 });
        var second = frames.Skip(secondAt).ToList();
        Assert.Equal(EventKind.Staged, Assert.IsType<EventFrame>(second[1]).Kind);
        int motionAt = second.IndexOf(f => f is EventFrame { Kind: EventKind.Motion });
        EventFrame motion = (EventFrame)second[motionAt];
        Assert.Equal(MotionCause.AccelOnset, motion.Cause);
        Assert.Equal(10_001_000, motion.TimeMicros);

        // The second pre-trigger starts after the last sample written in the first run.
        long lastOfFirstRun = frames.Take(secondAt).OfType<AccelerationFrame>().Max(a => a.FirstIndex + a.Samples.Count - 1);
        var preTrigger = second.Skip(2).Take(motionAt - 2).Cast<AccelerationFrame>().ToList();
        Assert.True(preTrigger[0].FirstIndex > lastOfFirstRun);
        Assert.Equal(settings.PreTriggerSamples, preTrigger.Sum(a => a.Samples.Count));
        Assert.Equal(second.OfType<PulsesFrame>().Sum(p => p.Observations.Count), summaries[1].ObservationsWritten);
        Assert.Equal(run.Fed[^1].Count - configs[1].OriginCount, summaries[1].Channel0Count);
    }

    [Fact]
    public void ABurstLargerThanOneFrameIsSplitSharingItsReadTime()
    {
        var settings = new LoggerSettings();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(2.5005, HalfG));
        run.RunUntil(3_000_000);
        int before = sink.Frames.Count;

        short[] big = new short[250 * 3];
        for (int i = 0; i < 250; i++)
        {
            big[i * 3] = (short)i;
            big[(i * 3) + 2] = 1000;
        }

        recorder.OnAccelBurst(big, 250, 150_000, 3_250_000);
        var split = sink.Frames.Skip(before).Cast<AccelerationFrame>().ToList();
        Assert.Equal(new[] { 100, 100, 50 }, split.Select(a => a.Samples.Count));
        Assert.Equal(new long[] { 150_000, 150_100, 150_200 }, split.Select(a => a.FirstIndex));
        Assert.All(split, a => Assert.Equal(3_250_000, a.ReadMicros));
        Assert.Equal(Enumerable.Range(0, 250).Select(i => (short)i), split.SelectMany(a => a.Samples).Select(x => x.X));
    }

}
