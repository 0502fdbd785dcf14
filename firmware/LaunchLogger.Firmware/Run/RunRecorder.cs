using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Run
{
    /// <summary>The run state machine and the log it writes: idle → staged → moving → rolled out
    /// → stopped. Fed with pulse observations, accelerometer bursts, inputs and clock ticks; every
    /// buffer is made in the constructor, so feeding it allocates nothing.</summary>
    /// <remarks>
    /// Staging: with an accelerometer, the means of consecutive blocks of
    /// <see cref="LoggerSettings.StillBlockMicros"/> stay inside <see cref="LoggerSettings.StillBandMilliG"/>
    /// on every axis and no pulse arrives for <see cref="LoggerSettings.StageHoldMicros"/>; the mean
    /// of that window's samples but its latest block (each block vouched for by the one after it)
    /// is the resting gravity vector. Block means, not samples: the band is about the car's
    /// low-frequency acceleration, which sample noise and engine vibration do not move (a noisy
    /// sensor alone spans the band sample to sample). Without an accelerometer, no pulse for that time.
    /// Motion: while staged, the distance channel's count changes, or the forward acceleration
    /// (minus its resting value) averaged over the onset window (<see cref="OnsetWindowSamples"/>:
    /// <see cref="LoggerSettings.MotionConfirmSamples"/>, or a still-test block when that is longer,
    /// so an idling engine's shake along the car averages out as it does in the still test) passes
    /// <see cref="LoggerSettings.MotionThresholdMilliG"/>; first motion is then where the stretch of
    /// most excess over the threshold begins (the sample after the lowest running sum of forward
    /// acceleration less the threshold, a one-sided cumulative sum), no earlier than the window. A
    /// step is timed to its first sample; a shake of amplitude A above the threshold can put it
    /// early by at most about 0.6 of the shake's period (0.4 at A = 1.5 × the threshold, 0.63 at
    /// 3 ×), never late. A distance pulse that comes first (a launch just over the threshold, whose
    /// window passes up to a still block late) opens the run with first motion at its bracket start,
    /// or where the stretch over the threshold began if the accelerometer has one under way. A car that rolls
    /// <see cref="LoggerSettings.UnstagedOpenMicrometres"/> without being staged opens a rolling run.
    /// Rollout: the distance channel's count reaches the rollout distance; the time is
    /// interpolated linearly, in integer arithmetic, between the bracket midpoints on either side.
    /// Stop: no pulse for <see cref="LoggerSettings.StopHoldMicros"/>.
    /// Bench rest (accelerometer only): the mark button held for <see cref="LoggerSettings.BenchRestHoldMicros"/>
    /// while staged arms it (phase <see cref="RunPhase.BenchRest"/>; accelerometer onset is not
    /// looked for while the button is down, as pressing it jolts the box); from the button's
    /// release the samples are written, outside any run, for <see cref="LoggerSettings.BenchRestMicros"/>,
    /// between a bench-rest frame and its end frame (LOG-FORMAT.md, 0x09 and 0x0A). A pulse on
    /// any channel ends it as spoiled (the car moved). Then the box waits for stillness again.
    /// </remarks>
    public sealed class RunRecorder
    {
        /// <summary>The most samples one acceleration frame carries.</summary>
        public const int MaxSamplesPerAccelFrame = 100;

        private readonly LoggerSettings settings;
        private readonly FrameWriter writer;
        private readonly HealthCounters health;
        private readonly AccelPreTriggerRing ring;
        private readonly PulseBatch[] batches;
        private readonly long[] lastCount;
        private readonly bool[] countKnown;
        private readonly long[] originCount;
        private readonly int[] onsetWindow;
        private readonly long samplePeriodNanos;
        private readonly long rolloutScaled;
        private readonly int circumference;
        private readonly int pulsesPerRevolution;

        private RunPhase phase;
        private bool runOpen;
        private bool runStaged;
        private bool rolloutReached;
        private bool brakeApplied;
        private bool preTriggerDraining;

        // Stillness (accelerometer): the block being summed, then the window of blocks whose
        // sums stay inside the band (min/max per axis, in block-sum units), the sums of its
        // vouched samples for the mean, and its latest block's sums, not yet vouched for.
        private readonly int blockSamples;
        private readonly int blockBand;
        private int blockFill;
        private long blockStartMicros;
        private int blockX, blockY, blockZ;
        private bool stillOpen;
        private long stillSinceMicros;
        private int minX, maxX, minY, maxY, minZ, maxZ;
        private int lastBlockX, lastBlockY, lastBlockZ;
        private long sumX, sumY, sumZ;
        private int stillSamples;

        // Resting state while staged.
        private long stagedSinceMicros;
        private int restX, restY, restZ;
        private int restSamples;
        private int onsetFill;
        private int onsetPos;
        private long onsetSum;

        // The onset's start: the forward deviation less the threshold, summed while staged, and
        // the sample after its lowest sum so far (where the stretch of most excess begins).
        private long onsetExcess;
        private long onsetExcessLowest;
        private long onsetFromMicros;

        private long lastPulseChangeMicros;
        private long idleRollStartCount;
        private bool idleRolling;

        // The open run.
        private long runOpenedMicros;
        private long motionMicros;
        private long rolloutMicros;
        private long lastPulseHiMicros;
        private long prevRelCount;
        private long prevMidMicros;
        private long observationsWritten;
        private long accelSamplesWritten;
        private long framesAtRunStart;
        private long nextHealthMicros;

        // The mark button while no run is open, and the bench rest.
        private bool markHeld;
        private long markPressedMicros;
        private bool restRecording;
        private int restNumber;
        private long restOpenedMicros;
        private long restSamplesWritten;
        private long restSamplesLost;
        private long framesAtRestStart;

        /// <summary>Checks the settings and allocates every buffer.</summary>
        /// <exception cref="System.ArgumentException">The settings are unusable; the message says why.</exception>
        public RunRecorder(LoggerSettings settings, IByteSink sink, HealthCounters health)
        {
            if (settings == null)
            {
                throw new System.ArgumentNullException("settings");
            }

            string problem = settings.Validate();
            if (problem != null)
            {
                throw new System.ArgumentException(problem);
            }

            this.settings = settings;
            this.health = health == null ? new HealthCounters() : health;
            writer = new FrameWriter(sink, this.health);
            int channels = settings.ChannelCount;
            batches = new PulseBatch[channels];
            for (int c = 0; c < channels; c++)
            {
                batches[c] = new PulseBatch(c, settings.PulseFrameMaxBodyBytes);
            }

            lastCount = new long[channels];
            countKnown = new bool[channels];
            originCount = new long[channels];
            ring = settings.AccelPresent
                ? new AccelPreTriggerRing(settings.PreTriggerSamples, settings.PreTriggerBursts)
                : null;
            onsetWindow = new int[OnsetWindowSamples(settings)];
            samplePeriodNanos = settings.AccelPresent ? 1000000000000L / settings.AccelOutputDataRateMilliHz : 0;
            blockSamples = StillBlockSamples(settings);
            blockBand = settings.StillBandMilliG * blockSamples;
            circumference = settings.CircumferenceMicrometres;
            pulsesPerRevolution = settings.PulsesPerRevolution;
            rolloutScaled = (long)settings.RolloutMicrometres * pulsesPerRevolution;
            phase = RunPhase.Idle;
        }

        /// <summary>Where the state machine stands.</summary>
        public RunPhase Phase
        {
            get { return phase; }
        }

        /// <summary>Runs opened since power-up; the open run's number while one is open.</summary>
        public int RunNumber { get; private set; }

        /// <summary>The health counters this recorder writes.</summary>
        public HealthCounters Health
        {
            get { return health; }
        }

        /// <summary>Frames written since power-up.</summary>
        public long FramesWritten
        {
            get { return writer.FramesWritten; }
        }

        /// <summary>The last run's first-motion time (µs), 0 before any run.</summary>
        public long MotionMicros
        {
            get { return motionMicros; }
        }

        /// <summary>The last run's rollout mark (µs), 0 when not reached.</summary>
        public long RolloutMicros
        {
            get { return rolloutMicros; }
        }

        /// <summary>Bench rests opened since power-up (the open one's number while one records).</summary>
        public int BenchRestNumber
        {
            get { return restNumber; }
        }

        /// <summary>True while a bench rest is recording (armed and released, not yet ended).</summary>
        public bool BenchRestRecording
        {
            get { return restRecording; }
        }

        /// <summary>The resting gravity vector recorded at staging (mg).</summary>
        public int RestX
        {
            get { return restX; }
        }

        /// <summary>The resting gravity vector recorded at staging (mg).</summary>
        public int RestY
        {
            get { return restY; }
        }

        /// <summary>The resting gravity vector recorded at staging (mg).</summary>
        public int RestZ
        {
            get { return restZ; }
        }

        /// <summary>Takes one pulse observation, read through the reference: the device's
        /// interpreter copies a struct into a new heap object whenever it is passed or loaded by
        /// value, so the capture path never does.</summary>
        public void OnPulseObservation(ref PulseObservation observation)
        {
            OnPulse(observation.Channel, observation.Count, observation.LoMicros, observation.HiMicros);
        }

        /// <summary>Takes one pulse observation as its four fields: the cumulative count of
        /// <paramref name="channel"/> reached <paramref name="count"/> in (<paramref name="loMicros"/>,
        /// <paramref name="hiMicros"/>].</summary>
        public void OnPulse(int channel, long count, long loMicros, long hiMicros)
        {
            if (channel < 0 || channel >= lastCount.Length)
            {
                throw new System.ArgumentOutOfRangeException("channel", "no such pulse channel");
            }

            long width = hiMicros - loMicros;
            if (width > settings.BracketLimitMicros)
            {
                health.WideBrackets++;
            }

            if (width > health.WidestBracketMicros)
            {
                health.WidestBracketMicros = width;
            }

            if (!countKnown[channel])
            {
                // The first reading only tells where the counter stands.
                countKnown[channel] = true;
                lastCount[channel] = count;
                return;
            }

            long before = lastCount[channel];
            if (count <= before)
            {
                if (count < before)
                {
                    health.CountsWentBackwards++;
                }

                return;
            }

            if (channel == 0)
            {
                OnDistancePulse(count, loMicros, hiMicros, before);
            }
            else if (runOpen)
            {
                AddToBatch(channel, count, loMicros, hiMicros);
            }
            else if (phase == RunPhase.BenchRest)
            {
                CarMovedDuringBenchRest(hiMicros);
            }

            lastCount[channel] = count;
        }

        /// <summary>Tells the recorder where a channel's counter stands before any edge, so that
        /// the first edge after power-up already counts as a change.</summary>
        public void SetCounterOrigin(int channel, long count)
        {
            countKnown[channel] = true;
            lastCount[channel] = count;
        }

        /// <summary>Takes one burst of accelerometer samples, read from the FIFO at
        /// <paramref name="readMicros"/>; <paramref name="firstIndex"/> numbers its first sample.</summary>
        public void OnAccelBurst(short[] xyzMilliG, int count, long firstIndex, long readMicros)
        {
            if (ring == null || count <= 0)
            {
                return;
            }

            int fullScale = settings.AccelFullScaleMilliG;
            for (int i = 0; i < count; i++)
            {
                int at = i * 3;
                if (IsClipped(xyzMilliG[at], fullScale) || IsClipped(xyzMilliG[at + 1], fullScale) || IsClipped(xyzMilliG[at + 2], fullScale))
                {
                    health.AccelSamplesClipped++;
                }
            }

            if (runOpen)
            {
                if (preTriggerDraining)
                {
                    // Older samples still wait in the ring: queue these behind them, writing
                    // the oldest first until they fit, so nothing is dropped or reordered.
                    while (!ring.HasRoomFor(count))
                    {
                        accelSamplesWritten += ring.WriteTo(writer, MaxSamplesPerAccelFrame, count);
                    }

                    ring.Add(xyzMilliG, count, firstIndex, readMicros);
                    return;
                }

                WriteAccel(xyzMilliG, 0, count, firstIndex, readMicros);
                return;
            }

            ring.Add(xyzMilliG, count, firstIndex, readMicros);
            if (restRecording)
            {
                // Also in the ring, so that a run opening after the rest finds its pre-trigger.
                WriteAccelFrames(xyzMilliG, 0, count, firstIndex, readMicros);
                restSamplesWritten += count;
                return;
            }

            for (int i = 0; i < count && !runOpen; i++)
            {
                long sampleMicros = readMicros - ((count - 1 - i) * samplePeriodNanos / 1000);
                int at = i * 3;
                OnStillnessSample(xyzMilliG[at], xyzMilliG[at + 1], xyzMilliG[at + 2], sampleMicros);
                if (phase == RunPhase.Staged && !markHeld)
                {
                    OnOnsetSample(xyzMilliG[at + settings.ForwardAxis], sampleMicros, readMicros);
                }
            }
        }

        /// <summary>The accelerometer's FIFO overflowed and about <paramref name="lostSamples"/>
        /// samples were lost before <paramref name="readMicros"/>.</summary>
        public void OnAccelGap(long lostSamples, long readMicros)
        {
            if (runOpen)
            {
                WriteEvent(EventKind.AccelGap, readMicros);
                writer.PutVarint(lostSamples < 0 ? 0 : lostSamples);
                writer.End();
            }
            else if (restRecording && lostSamples > 0)
            {
                restSamplesLost += lostSamples;
            }

            // Samples are missing: stillness cannot be vouched for across the gap.
            RestartStillness();
        }

        /// <summary>The brake switch changed state, read at <paramref name="timeMicros"/> (the
        /// time of the change is not known more closely).</summary>
        public void OnBrakeSwitch(bool applied, long timeMicros)
        {
            OnBrakeSwitch(applied, timeMicros, 0);
        }

        /// <summary>The brake switch changed state: first read at <paramref name="timeMicros"/>,
        /// unchanged at the reading <paramref name="readGapMicros"/> earlier (0: not known). The
        /// gap is written with the event (LOG-FORMAT.md, events 5 and 6).</summary>
        public void OnBrakeSwitch(bool applied, long timeMicros, long readGapMicros)
        {
            if (applied == brakeApplied)
            {
                return;
            }

            brakeApplied = applied;
            if (runOpen)
            {
                WriteEvent(applied ? EventKind.BrakeOn : EventKind.BrakeOff, timeMicros);
                if (readGapMicros > 0)
                {
                    writer.PutVarint(readGapMicros);
                }

                writer.End();
            }
        }

        /// <summary>The manual mark button was pressed.</summary>
        public void OnManualMark(long timeMicros)
        {
            if (runOpen)
            {
                WriteEvent(EventKind.Mark, timeMicros);
                writer.End();
            }
        }

        /// <summary>The mark button's debounced level changed at <paramref name="timeMicros"/>:
        /// a press marks an open run (<see cref="OnManualMark"/>); while staged, a hold arms a bench
        /// rest (<see cref="Tick"/>) and its release starts the recording.</summary>
        public void OnMarkButton(bool pressed, long timeMicros)
        {
            if (pressed)
            {
                OnManualMark(timeMicros);
                markHeld = true;
                markPressedMicros = timeMicros;
                return;
            }

            markHeld = false;
            if (phase == RunPhase.BenchRest && !restRecording)
            {
                OpenBenchRest(timeMicros);
            }
            else if (phase == RunPhase.Staged)
            {
                // The press may have jolted the box: onset starts over with fresh samples.
                RestartOnset();
            }
        }

        /// <summary>Advances the time-driven parts: pulse-only staging, batch age, health
        /// frames and the stop.</summary>
        public void Tick(long nowMicros)
        {
            if (!runOpen)
            {
                if (phase == RunPhase.BenchRest)
                {
                    if (restRecording && nowMicros - restOpenedMicros >= settings.BenchRestMicros)
                    {
                        CloseBenchRest(LogFormat.BenchRestComplete, nowMicros);
                    }

                    return;
                }

                if (markHeld && phase == RunPhase.Staged && settings.AccelPresent
                    && nowMicros - markPressedMicros >= settings.BenchRestHoldMicros)
                {
                    // Armed: the indicator tells the user to let go; the release starts the recording.
                    phase = RunPhase.BenchRest;
                    return;
                }

                if (!settings.AccelPresent && (phase == RunPhase.Idle || phase == RunPhase.Stopped)
                    && nowMicros - lastPulseChangeMicros >= settings.StageHoldMicros)
                {
                    restSamples = 0;
                    EnterStaged(lastPulseChangeMicros);
                }

                return;
            }

            if (preTriggerDraining)
            {
                DrainPreTrigger(settings.PreTriggerSamplesPerStep);
            }

            for (int c = 0; c < batches.Length; c++)
            {
                if (!batches[c].IsEmpty && nowMicros - batches[c].FirstHiMicros >= settings.PulseFrameMaxAgeMicros)
                {
                    batches[c].Flush(writer);
                }
            }

            if (nowMicros >= nextHealthMicros)
            {
                WriteHealth(nowMicros);

                // The run's configuration again: a reader that lost the first copy (one bad bit)
                // opens the run from this one (LOG-FORMAT.md, 0x08).
                WriteConfiguration(FrameType.ConfigurationCopy);
                nextHealthMicros = nowMicros + settings.HealthIntervalMicros;
            }

            if (nowMicros - lastPulseHiMicros >= settings.StopHoldMicros)
            {
                CloseRun(nowMicros, true);
            }
        }

        /// <summary>Marks a power-up in the log: a lone delimiter, then the PowerUp frame
        /// (LOG-FORMAT.md, 0x07), so that a reader tells this power-up from the one before it even
        /// when a power cut left that one's last frame unfinished in the same file. Call once,
        /// before anything else is written.</summary>
        /// <param name="nowMicros">The clock when the core first ran.</param>
        public void PowerUp(long nowMicros)
        {
            writer.WriteDelimiter();
            writer.Begin(FrameType.PowerUp);
            writer.PutVarint(nowMicros < 0 ? 0 : nowMicros);
            writer.PutByte(FirmwareVersion.Major);
            writer.PutByte(FirmwareVersion.Minor);
            writer.PutByte(FirmwareVersion.Patch);
            writer.End();
        }

        /// <summary>Closes an open run without a stop (power going down, user request).</summary>
        public void Shutdown(long nowMicros)
        {
            if (runOpen)
            {
                CloseRun(nowMicros, false);
            }

            if (restRecording)
            {
                CloseBenchRest(LogFormat.BenchRestCutShort, nowMicros);
            }
        }

        private static bool IsClipped(short value, int fullScale)
        {
            return value >= fullScale || value <= -fullScale;
        }

        private void OnDistancePulse(long count, long loMicros, long hiMicros, long before)
        {
            lastPulseChangeMicros = hiMicros;
            RestartStillness();
            if (phase == RunPhase.BenchRest)
            {
                CarMovedDuringBenchRest(hiMicros);
            }
            switch (phase)
            {
                case RunPhase.Staged:
                    OpenRun(true, MotionCause.PulseCount, PulseOpeningMotionMicros(loMicros), hiMicros);
                    break;
                case RunPhase.Idle:
                case RunPhase.Stopped:
                    if (!idleRolling)
                    {
                        idleRolling = true;
                        idleRollStartCount = before;
                    }

                    if ((count - idleRollStartCount) * circumference >= (long)settings.UnstagedOpenMicrometres * pulsesPerRevolution)
                    {
                        OpenRun(false, MotionCause.RollingDistance, loMicros, hiMicros);
                    }

                    break;
            }

            if (runOpen)
            {
                AddToBatch(0, count, loMicros, hiMicros);
                if (!rolloutReached)
                {
                    CheckRollout(count, loMicros, hiMicros);
                }
            }
        }

        private void CheckRollout(long count, long loMicros, long hiMicros)
        {
            long rel = count - originCount[0];
            long mid = loMicros + ((hiMicros - loMicros) / 2);
            if (rel * circumference >= rolloutScaled)
            {
                long span = mid - prevMidMicros;
                long pulses = rel - prevRelCount;
                long num = rolloutScaled - (prevRelCount * circumference);
                long den = pulses * circumference;
                rolloutMicros = prevMidMicros + (span * num / den);
                long speedMillimetresPerSecond = span > 0 ? pulses * circumference * 1000 / pulsesPerRevolution / span : 0;
                rolloutReached = true;
                phase = RunPhase.RolledOut;
                WriteEvent(EventKind.Rollout, rolloutMicros);
                writer.PutVarint(speedMillimetresPerSecond);
                writer.End();
            }

            prevRelCount = rel;
            prevMidMicros = mid;
        }

        /// <summary>Samples in one block of the still test: <see cref="LoggerSettings.StillBlockMicros"/>
        /// at the output data rate, rounded, at least one.</summary>
        public static int StillBlockSamples(LoggerSettings settings)
        {
            if (settings == null || !settings.AccelPresent)
            {
                return 1;
            }

            long samples = (((long)settings.StillBlockMicros * settings.AccelOutputDataRateMilliHz) + 500000000L) / 1000000000L;
            return samples < 1 ? 1 : (int)samples;
        }

        private void OnStillnessSample(short x, short y, short z, long sampleMicros)
        {
            if (blockFill == 0)
            {
                blockStartMicros = sampleMicros;
            }

            blockX += x;
            blockY += y;
            blockZ += z;
            blockFill++;
            if (blockFill == blockSamples)
            {
                OnStillBlock(sampleMicros);
            }
        }

        private void OnStillBlock(long endMicros)
        {
            if (!stillOpen || WidensPastBand(blockX, blockY, blockZ))
            {
                StartStillWindow();
            }
            else
            {
                Widen();
            }

            blockFill = 0;
            blockX = 0;
            blockY = 0;
            blockZ = 0;
            bool held = stillSamples > 0 && endMicros - stillSinceMicros >= settings.StageHoldMicros;
            if (phase != RunPhase.Idle && phase != RunPhase.Stopped)
            {
                if (phase == RunPhase.Staged && held)
                {
                    // Still for longer: refine the resting vector with the longer window.
                    SetRestFromWindow();
                }

                return;
            }

            if (held && lastPulseChangeMicros <= stillSinceMicros)
            {
                SetRestFromWindow();
                EnterStaged(stillSinceMicros);
            }
        }

        /// <summary>The still test starts over from the next sample: a pulse, missing samples, or
        /// samples the test did not see (a run or a bench rest).</summary>
        private void RestartStillness()
        {
            stillOpen = false;
            blockFill = 0;
            blockX = 0;
            blockY = 0;
            blockZ = 0;
        }

        private bool WidensPastBand(int x, int y, int z)
        {
            int band = blockBand;
            return Spread(minX, maxX, x) > band || Spread(minY, maxY, y) > band || Spread(minZ, maxZ, z) > band;
        }

        private static int Spread(int min, int max, int value)
        {
            if (value < min)
            {
                return max - value;
            }

            return value > max ? value - min : max - min;
        }

        private void StartStillWindow()
        {
            stillOpen = true;
            stillSinceMicros = blockStartMicros;
            minX = maxX = lastBlockX = blockX;
            minY = maxY = lastBlockY = blockY;
            minZ = maxZ = lastBlockZ = blockZ;
            sumX = 0;
            sumY = 0;
            sumZ = 0;
            stillSamples = 0;
        }

        private void Widen()
        {
            // The window's latest block is vouched for by this one: its samples join the mean.
            sumX += lastBlockX;
            sumY += lastBlockY;
            sumZ += lastBlockZ;
            stillSamples += blockSamples;
            int x = blockX;
            int y = blockY;
            int z = blockZ;
            if (x < minX) minX = x;
            if (x > maxX) maxX = x;
            if (y < minY) minY = y;
            if (y > maxY) maxY = y;
            if (z < minZ) minZ = z;
            if (z > maxZ) maxZ = z;
            lastBlockX = x;
            lastBlockY = y;
            lastBlockZ = z;
        }

        private void SetRestFromWindow()
        {
            restX = (int)DivideRounded(sumX, stillSamples);
            restY = (int)DivideRounded(sumY, stillSamples);
            restZ = (int)DivideRounded(sumZ, stillSamples);
            restSamples = stillSamples;
        }

        private static long DivideRounded(long sum, int count)
        {
            return sum >= 0 ? (sum + (count / 2)) / count : -((-sum + (count / 2)) / count);
        }

        private void EnterStaged(long sinceMicros)
        {
            phase = RunPhase.Staged;
            stagedSinceMicros = sinceMicros;
            idleRolling = false;
            RestartOnset();
        }

        private void RestartOnset()
        {
            onsetFill = 0;
            onsetPos = 0;
            onsetSum = 0;
            onsetExcess = 0;
            onsetExcessLowest = long.MaxValue;
        }

        private void OnOnsetSample(short forwardRaw, long sampleMicros, long readMicros)
        {
            int rest = settings.ForwardAxis == 0 ? restX : settings.ForwardAxis == 1 ? restY : restZ;
            int deviation = forwardRaw - rest;
            if (settings.ForwardAxisReversed)
            {
                deviation = -deviation;
            }

            int threshold = settings.MotionThresholdMilliG;
            if (onsetExcess < onsetExcessLowest)
            {
                onsetExcessLowest = onsetExcess;
                onsetFromMicros = sampleMicros;
            }

            onsetExcess += deviation - threshold;
            int n = onsetWindow.Length;
            if (onsetFill == n)
            {
                onsetSum -= onsetWindow[onsetPos];
            }
            else
            {
                onsetFill++;
            }

            onsetWindow[onsetPos] = deviation;
            onsetSum += deviation;
            onsetPos = (onsetPos + 1) % n;
            if (onsetFill == n && onsetSum >= (long)threshold * n)
            {
                // Onset estimate: where the stretch of most excess over the threshold begins (a
                // lone vibration peak has little), no earlier than the window's oldest sample.
                long oldestMicros = sampleMicros - ((n - 1) * samplePeriodNanos / 1000);
                OpenRun(true, MotionCause.AccelOnset, onsetFromMicros > oldestMicros ? onsetFromMicros : oldestMicros, readMicros);
            }
        }

        /// <summary>First motion of a run that a distance pulse opens while staged: the pulse's
        /// bracket start, or, when the accelerometer has a stretch over the threshold under way that
        /// began earlier, that stretch's start. A launch only just over the threshold passes the onset
        /// window's mean up to a still block after it begins, and a fine pickup's first pulse may come
        /// first (at 42 mg, 0.445 s on against the 500-ms block's 0.477 s); its stretch starts at the
        /// launch. The stretch lies within the window (one longer would have passed it), and while the
        /// mark button is down onset is not followed, so its stretch is stale then.</summary>
        private long PulseOpeningMotionMicros(long loMicros)
        {
            if (settings.AccelPresent && !markHeld && onsetExcess > onsetExcessLowest && onsetFromMicros < loMicros)
            {
                return onsetFromMicros;
            }

            return loMicros;
        }

        /// <summary>Samples in the window whose forward mean must pass the motion threshold: the
        /// confirm window or the still test's block, whichever holds more, so engine vibration
        /// averages out there as it does in the still test.</summary>
        public static int OnsetWindowSamples(LoggerSettings settings)
        {
            if (settings == null)
            {
                return 1;
            }

            int block = StillBlockSamples(settings);
            return settings.MotionConfirmSamples > block ? settings.MotionConfirmSamples : block;
        }

        private void OpenRun(bool staged, MotionCause cause, long firstMotionMicros, long openedMicros)
        {
            RunNumber++;
            runOpen = true;
            runStaged = staged;
            rolloutReached = false;
            phase = RunPhase.Moving;
            runOpenedMicros = openedMicros;
            motionMicros = firstMotionMicros;
            rolloutMicros = 0;
            lastPulseHiMicros = openedMicros;
            prevRelCount = 0;
            prevMidMicros = firstMotionMicros;
            observationsWritten = 0;
            accelSamplesWritten = 0;
            framesAtRunStart = writer.FramesWritten;
            nextHealthMicros = openedMicros + settings.HealthIntervalMicros;
            idleRolling = false;

            // A hold of the mark button begun before the run arms no bench rest after it.
            markHeld = false;
            RestartStillness();
            for (int c = 0; c < lastCount.Length; c++)
            {
                originCount[c] = lastCount[c];
                batches[c].Reset();
            }

            WriteConfiguration(FrameType.Configuration);
            if (staged && settings.AccelPresent)
            {
                WriteEvent(EventKind.Staged, stagedSinceMicros);
                writer.PutSignedVarint(restX);
                writer.PutSignedVarint(restY);
                writer.PutSignedVarint(restZ);
                writer.PutVarint(restSamples);
                writer.End();
            }
            else if (staged)
            {
                WriteEvent(EventKind.Staged, stagedSinceMicros);
                writer.PutSignedVarint(0);
                writer.PutSignedVarint(0);
                writer.PutSignedVarint(0);
                writer.PutVarint(0);
                writer.End();
            }

            if (ring != null)
            {
                // All at once, or a share per loop pass from Tick (PreTriggerSamplesPerStep),
                // starting with the Tick of this same pass.
                preTriggerDraining = true;
                if (settings.PreTriggerSamplesPerStep == 0)
                {
                    DrainPreTrigger(0);
                }
            }

            WriteEvent(EventKind.Motion, firstMotionMicros);
            writer.PutByte((byte)cause);
            writer.End();
            if (brakeApplied)
            {
                WriteEvent(EventKind.BrakeOn, openedMicros);
                writer.End();
            }
        }

        private void CloseRun(long nowMicros, bool byStop)
        {
            if (preTriggerDraining)
            {
                DrainPreTrigger(0);
            }

            for (int c = 0; c < batches.Length; c++)
            {
                batches[c].Flush(writer);
            }

            if (byStop)
            {
                WriteEvent(EventKind.Stopped, lastPulseHiMicros);
                writer.End();
            }

            WriteHealth(nowMicros);
            writer.Begin(FrameType.Summary);
            writer.PutVarint(RunNumber);
            writer.PutVarint(runOpenedMicros);
            writer.PutVarint(motionMicros);
            writer.PutVarint(rolloutReached ? rolloutMicros : 0);
            writer.PutVarint(byStop ? lastPulseHiMicros : 0);
            writer.PutVarint(lastCount[0] - originCount[0]);
            writer.PutVarint(lastCount.Length > 1 ? lastCount[1] - originCount[1] : 0);
            writer.PutVarint(observationsWritten);
            writer.PutVarint(accelSamplesWritten);
            writer.PutVarint(writer.FramesWritten - framesAtRunStart + 1);
            byte flags = 0;
            if (runStaged) flags |= LogFormat.SummaryFlagStaged;
            if (rolloutReached) flags |= LogFormat.SummaryFlagRolloutReached;
            if (byStop) flags |= LogFormat.SummaryFlagClosedByStop;
            writer.PutByte(flags);
            writer.End();
            runOpen = false;
            phase = RunPhase.Stopped;
            RestartStillness();
            lastPulseChangeMicros = byStop ? lastPulseHiMicros : nowMicros;
        }

        /// <summary>A pulse while a bench rest is armed or recording: the car moved. A recording
        /// ends spoiled and the box waits for stillness again; an armed rest is dropped and the
        /// box is staged again, so that the pulse opens a run as it would have.</summary>
        private void CarMovedDuringBenchRest(long pulseMicros)
        {
            if (restRecording)
            {
                CloseBenchRest(LogFormat.BenchRestSpoiledByPulse, pulseMicros);
            }
            else
            {
                phase = RunPhase.Staged;
            }
        }

        private void OpenBenchRest(long releasedMicros)
        {
            restNumber++;
            restRecording = true;
            restOpenedMicros = releasedMicros;
            restSamplesWritten = 0;
            restSamplesLost = 0;
            framesAtRestStart = writer.FramesWritten;
            writer.Begin(FrameType.BenchRest);
            writer.PutVarint(restNumber);
            writer.PutVarint(releasedMicros);
            writer.PutVarint(settings.BenchRestMicros);
            writer.PutVarint(settings.AccelOutputDataRateMilliHz);
            writer.PutVarint(settings.AccelFullScaleMilliG);
            writer.PutByte((byte)settings.ForwardAxis);
            writer.PutByte(settings.ForwardAxisReversed ? (byte)1 : (byte)0);
            writer.End();
        }

        private void CloseBenchRest(byte outcome, long endedMicros)
        {
            writer.Begin(FrameType.BenchRestEnd);
            writer.PutVarint(restNumber);
            writer.PutVarint(endedMicros);
            writer.PutByte(outcome);
            writer.PutVarint(restSamplesWritten);
            writer.PutVarint(restSamplesLost);
            writer.PutVarint(writer.FramesWritten - framesAtRestStart + 1);
            writer.End();
            restRecording = false;
            phase = RunPhase.Idle;
            RestartStillness();
        }

        private void AddToBatch(int channel, long count, long loMicros, long hiMicros)
        {
            PulseBatch batch = batches[channel];
            batch.Add(count - originCount[channel], loMicros, hiMicros);
            observationsWritten++;
            if (channel == 0 && hiMicros > lastPulseHiMicros)
            {
                lastPulseHiMicros = hiMicros;
            }

            if (batch.IsFull)
            {
                batch.Flush(writer);
            }
        }

        private void WriteAccel(short[] xyzMilliG, int start, int count, long firstIndex, long readMicros)
        {
            WriteAccelFrames(xyzMilliG, start, count, firstIndex, readMicros);
            accelSamplesWritten += count;
        }

        private void WriteAccelFrames(short[] xyzMilliG, int start, int count, long firstIndex, long readMicros)
        {
            int done = 0;
            while (done < count)
            {
                int n = count - done;
                if (n > MaxSamplesPerAccelFrame)
                {
                    n = MaxSamplesPerAccelFrame;
                }

                writer.Begin(FrameType.Acceleration);
                writer.PutVarint(readMicros);
                writer.PutVarint(firstIndex + done);
                writer.PutVarint(n);
                writer.PutInt16s(xyzMilliG, (start + done) * 3, n * 3);

                writer.End();
                done += n;
            }
        }

        /// <summary>Writes up to <paramref name="maxSamples"/> of the ring's oldest samples (all of
        /// them for 0) as acceleration frames.</summary>
        private void DrainPreTrigger(int maxSamples)
        {
            accelSamplesWritten += ring.WriteTo(writer, MaxSamplesPerAccelFrame, maxSamples > 0 ? maxSamples : int.MaxValue);
            preTriggerDraining = ring.SampleCount > 0;
        }

        private void WriteEvent(EventKind kind, long timeMicros)
        {
            writer.Begin(FrameType.Event);
            writer.PutByte((byte)kind);
            writer.PutVarint(timeMicros < 0 ? 0 : timeMicros);
        }

        private void WriteHealth(long nowMicros)
        {
            writer.Begin(FrameType.Health);
            writer.PutVarint(nowMicros);
            writer.PutVarint(LogFormat.HealthCounterCount);
            for (int i = 0; i < LogFormat.HealthCounterCount; i++)
            {
                writer.PutVarint(health.Get(i));
            }

            writer.End();
        }

        private void WriteConfiguration(FrameType type)
        {
            writer.Begin(type);
            writer.PutByte(LogFormat.Version);
            writer.PutByte(FirmwareVersion.Major);
            writer.PutByte(FirmwareVersion.Minor);
            writer.PutByte(FirmwareVersion.Patch);
            writer.PutVarint(RunNumber);
            writer.PutVarint(runOpenedMicros);
            writer.PutVarint(originCount[0] < 0 ? 0 : originCount[0]);
            byte flags = 0;
            if (settings.AccelPresent) flags |= LogFormat.ConfigFlagAccelerometer;
            if (settings.SecondChannelEnabled) flags |= LogFormat.ConfigFlagSecondChannel;
            if (runStaged) flags |= LogFormat.ConfigFlagStaged;
            writer.PutByte(flags);
            writer.PutVarint(settings.PulsesPerRevolution);
            writer.PutVarint(settings.CircumferenceMicrometres);
            if (settings.SecondChannelEnabled)
            {
                writer.PutVarint(settings.SecondPulsesPerRevolution);
                writer.PutVarint(settings.SecondCircumferenceMicrometres);
            }

            writer.PutVarint(settings.RolloutMicrometres);
            writer.PutVarint(settings.AccelPresent ? settings.AccelOutputDataRateMilliHz : 0);
            writer.PutVarint(settings.AccelPresent ? settings.AccelFullScaleMilliG : 0);
            writer.PutByte((byte)settings.ForwardAxis);
            writer.PutByte(settings.ForwardAxisReversed ? (byte)1 : (byte)0);
            writer.PutVarint(settings.AccelPresent ? settings.PreTriggerSamples : 0);
            writer.PutVarint(settings.StageHoldMicros);
            writer.PutVarint(settings.StillBandMilliG);
            writer.PutVarint(settings.MotionThresholdMilliG);
            writer.PutVarint(settings.MotionConfirmSamples);
            writer.PutVarint(settings.StopHoldMicros);
            writer.PutVarint(settings.BracketLimitMicros);
            writer.PutVarint(settings.StillBlockMicros);
            writer.End();
        }
    }
}
