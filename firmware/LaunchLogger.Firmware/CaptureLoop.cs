using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware
{
    /// <summary>One pass of the box's main loop: drain pulse observations, read the
    /// accelerometer when due, watch the inputs, tick the recorder, show the phase.</summary>
    /// <remarks>Device glue builds one of these from its hardware and calls <see cref="Step"/>
    /// as often as it can. Optional parts (accelerometer, inputs, indicator) may be null.</remarks>
    public sealed class CaptureLoop
    {
        /// <summary>The most observations taken from the pulse source in one step, so that the
        /// accelerometer is never starved.</summary>
        public const int MaxObservationsPerStep = 64;

        private readonly MonotonicClock clock;
        private readonly IPulseSource pulses;
        private readonly IAccelerometer accelerometer;
        private readonly IDigitalInput brakeSwitch;
        private readonly IDigitalInput markButton;
        private readonly IStatusIndicator indicator;
        private readonly RunRecorder recorder;
        private readonly HealthCounters health;
        private readonly short[] burst;
        private readonly int burstCapacity;
        private readonly long accelIntervalMicros;
        private readonly long samplesPerSecondMilli;
        private long nextAccelMicros;
        private long lastAccelReadMicros;
        private long sampleIndex;
        private int maxSamplesPerStep;
        private bool accelBacklog;
        private Capture.Debouncer brakeLevel = new Capture.Debouncer(0, false);
        private Capture.Debouncer markLevel = new Capture.Debouncer(0, false);
        private long switchHoldMicros;
        private bool brakeApplied;
        private bool markPressed;
        private bool poweredUp;
        private bool phaseShown;
        private RunPhase shownPhase;
        private Capture.PulseObservation observation;

        /// <summary>Wires the loop together.</summary>
        /// <param name="clock">The box's monotonic clock.</param>
        /// <param name="pulses">Where pulse observations come from.</param>
        /// <param name="accelerometer">The accelerometer, or null.</param>
        /// <param name="brakeSwitch">The brake switch input, or null.</param>
        /// <param name="markButton">The manual mark button, or null.</param>
        /// <param name="indicator">The status LED or buzzer, or null.</param>
        /// <param name="recorder">The run recorder to feed.</param>
        /// <param name="burstCapacity">The most samples read from the FIFO at once: at least the FIFO's
        /// depth, so that one read drains it (the loss estimated after an overflow assumes that).</param>
        /// <param name="accelIntervalMicros">How often to read the FIFO (µs).</param>
        public CaptureLoop(
            MonotonicClock clock,
            IPulseSource pulses,
            IAccelerometer accelerometer,
            IDigitalInput brakeSwitch,
            IDigitalInput markButton,
            IStatusIndicator indicator,
            RunRecorder recorder,
            int burstCapacity,
            int accelIntervalMicros)
        {
            if (clock == null || pulses == null || recorder == null)
            {
                throw new System.ArgumentNullException(clock == null ? "clock" : pulses == null ? "pulses" : "recorder");
            }

            if (burstCapacity < 1)
            {
                throw new System.ArgumentOutOfRangeException("burstCapacity");
            }

            this.clock = clock;
            this.pulses = pulses;
            this.accelerometer = accelerometer;
            this.brakeSwitch = brakeSwitch;
            this.markButton = markButton;
            this.indicator = indicator;
            this.recorder = recorder;
            health = recorder.Health;
            this.burstCapacity = burstCapacity;
            burst = new short[burstCapacity * 3];
            this.accelIntervalMicros = accelIntervalMicros;
            samplesPerSecondMilli = accelerometer == null ? 0 : accelerometer.OutputDataRateMilliHz;
            lastAccelReadMicros = clock.NowMicros();
            maxSamplesPerStep = burstCapacity;
        }

        /// <summary>The most accelerometer samples taken in one pass (at most the burst capacity,
        /// which is the default). When a read is cut short the next pass reads again, so a full
        /// FIFO is emptied over several passes instead of stalling one.</summary>
        public int MaxAccelSamplesPerStep
        {
            get
            {
                return maxSamplesPerStep;
            }

            set
            {
                if (value < 1 || value > burstCapacity)
                {
                    throw new System.ArgumentOutOfRangeException("value");
                }

                maxSamplesPerStep = value;
            }
        }

        /// <summary>How long a new level of the brake switch or the mark button must hold before
        /// it counts (µs, default 0: every reading counts). The inputs are read raw once a pass;
        /// an accepted change is dated to the pass that first saw it, and a brake switch's event
        /// also records the time since the pass before (LOG-FORMAT.md, events 5 and 6): the switch
        /// changed in between. Set it before the first <see cref="Step"/>.</summary>
        public long SwitchHoldMicros
        {
            get
            {
                return switchHoldMicros;
            }

            set
            {
                if (value < 0)
                {
                    throw new System.ArgumentOutOfRangeException("value");
                }

                switchHoldMicros = value;
                brakeLevel = new Capture.Debouncer(value, false);
                markLevel = new Capture.Debouncer(value, false);
            }
        }

        /// <summary>One pass of the loop.</summary>
        public void Step()
        {
            if (!poweredUp)
            {
                // The first pass after power-up marks it in the log before anything else.
                poweredUp = true;
                recorder.PowerUp(clock.NowMicros());
            }

            PulseObservationDrain();
            long now = clock.NowMicros();
            if (accelerometer != null && (accelBacklog || now >= nextAccelMicros))
            {
                if (!accelBacklog)
                {
                    nextAccelMicros = now + accelIntervalMicros;
                }

                ReadAccelerometer();
            }

            // The recorder hears of a switch only when its debounced level changes: most passes
            // change nothing, and each call costs on the interpreter.
            if (brakeSwitch != null && brakeLevel.Update(brakeSwitch.IsActive(), now) != brakeApplied)
            {
                brakeApplied = !brakeApplied;
                recorder.OnBrakeSwitch(brakeApplied, brakeLevel.ChangedAtMicros, brakeLevel.ChangeGapMicros);
            }

            if (markButton != null && markLevel.Update(markButton.IsActive(), now) != markPressed)
            {
                markPressed = !markPressed;
                recorder.OnMarkButton(markPressed, markLevel.ChangedAtMicros);
            }

            recorder.Tick(clock.NowMicros());
            RunPhase phase = recorder.Phase;
            if (indicator != null && (!phaseShown || phase != shownPhase))
            {
                indicator.Show(phase);
                shownPhase = phase;
                phaseShown = true;
            }
        }

        private void PulseObservationDrain()
        {
            for (int i = 0; i < MaxObservationsPerStep; i++)
            {
                // A field, not a local: the device allocates struct locals on every method entry.
                if (!pulses.TryRead(out observation))
                {
                    return;
                }

                recorder.OnPulseObservation(ref observation);
            }
        }

        private void ReadAccelerometer()
        {
            bool overflowed;
            int n = accelerometer.ReadBurst(burst, maxSamplesPerStep, out overflowed);
            long readMicros = clock.NowMicros();
            accelBacklog = false;
            if (n < 0)
            {
                health.AccelReadFailures++;
                lastAccelReadMicros = readMicros;
                return;
            }

            // A read cut short may have left samples in the FIFO: read again next pass.
            bool cut = n == maxSamplesPerStep && maxSamplesPerStep < burstCapacity;
            accelBacklog = cut;
            if (overflowed)
            {
                health.AccelFifoOverflows++;
                long expected = (readMicros - lastAccelReadMicros) * samplesPerSecondMilli / 1000000000L;

                // After an overflow the FIFO was full: the burst capacity is its depth.
                long lost = expected - (cut ? burstCapacity : n);
                if (lost > 0)
                {
                    sampleIndex += lost;
                }

                recorder.OnAccelGap(lost, readMicros);
            }

            lastAccelReadMicros = readMicros;
            if (n > 0)
            {
                recorder.OnAccelBurst(burst, n, sampleIndex, readMicros);
                sampleIndex += n;
            }
        }
    }
}
