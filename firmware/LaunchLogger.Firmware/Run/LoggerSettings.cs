namespace LaunchLogger.Firmware.Run
{
    /// <summary>Everything the box needs to know about its car, sensors and thresholds. All of it
    /// is written into each run's configuration frame, so a log decodes on its own.</summary>
    /// <remarks>Integers with their unit in the name; defaults suit a typical club car with a
    /// 48-tooth pickup and a 1 kHz accelerometer. Call <see cref="Validate"/> before use; the
    /// recorder does.</remarks>
    public sealed class LoggerSettings
    {
        /// <summary>The still block's default length in the unit the boards' settings take it (ms).</summary>
        public const int DefaultStillBlockMs = 50;

        /// <summary>The shortest still block (ms).</summary>
        public const int MinStillBlockMs = 1;

        /// <summary>The longest still block (ms): a tenth of the default staging hold, and with it the
        /// longest the onset window can delay a launch's run (<see cref="RunRecorder.OnsetWindowSamples"/>).</summary>
        public const int MaxStillBlockMs = 500;

        /// <summary>Creates settings with the defaults.</summary>
        public LoggerSettings()
        {
            PulsesPerRevolution = 48;
            CircumferenceMicrometres = 1960000;
            SecondPulsesPerRevolution = 48;
            SecondCircumferenceMicrometres = 1960000;
            RolloutMicrometres = 304800;
            AccelPresent = true;
            AccelOutputDataRateMilliHz = 1000000;
            AccelFullScaleMilliG = 8000;
            ForwardAxis = 0;
            PreTriggerSamples = 1500;
            PreTriggerBursts = 128;
            StageHoldMicros = 1000000;
            StillBandMilliG = 60;
            StillBlockMicros = DefaultStillBlockMs * 1000;
            MotionThresholdMilliG = 40;
            MotionConfirmSamples = 16;
            StopHoldMicros = 2000000;
            BracketLimitMicros = 2000;
            UnstagedOpenMicrometres = 3000000;
            PulseFrameMaxAgeMicros = 100000;
            HealthIntervalMicros = 1000000;
            BenchRestHoldMicros = 3000000;
            BenchRestMicros = 20000000;
        }

        /// <summary>Pulses per wheel revolution on the distance channel (teeth × edges counted).</summary>
        public int PulsesPerRevolution { get; set; }

        /// <summary>Rolling circumference of the distance channel's wheel (µm).</summary>
        public int CircumferenceMicrometres { get; set; }

        /// <summary>True when a second pulse channel (another wheel) is wired.</summary>
        public bool SecondChannelEnabled { get; set; }

        /// <summary>Pulses per revolution on the second channel.</summary>
        public int SecondPulsesPerRevolution { get; set; }

        /// <summary>Rolling circumference of the second channel's wheel (µm).</summary>
        public int SecondCircumferenceMicrometres { get; set; }

        /// <summary>The rollout distance (µm): 304800 = 1 ft, the drag-strip convention.</summary>
        public int RolloutMicrometres { get; set; }

        /// <summary>True when an accelerometer is fitted.</summary>
        public bool AccelPresent { get; set; }

        /// <summary>Nominal accelerometer output data rate (mHz).</summary>
        public int AccelOutputDataRateMilliHz { get; set; }

        /// <summary>Accelerometer full scale (mg).</summary>
        public int AccelFullScaleMilliG { get; set; }

        /// <summary>The sensor axis that points along the car (0 = x, 1 = y, 2 = z).</summary>
        public int ForwardAxis { get; set; }

        /// <summary>True when <see cref="ForwardAxis"/> points backward.</summary>
        public bool ForwardAxisReversed { get; set; }

        /// <summary>Accelerometer samples kept from before the run opens.</summary>
        public int PreTriggerSamples { get; set; }

        /// <summary>Bursts the pre-trigger ring can keep track of.</summary>
        public int PreTriggerBursts { get; set; }

        /// <summary>How long the car must be still to be staged (µs).</summary>
        public int StageHoldMicros { get; set; }

        /// <summary>Peak-to-peak band per axis that still counts as still (mg), over the means of
        /// blocks of <see cref="StillBlockMicros"/>.</summary>
        public int StillBandMilliG { get; set; }

        /// <summary>Length of the blocks whose means the still band bounds (µs): long enough that
        /// sample noise and engine vibration average out (a block of T passes at most 1/(π·f·T) of a
        /// vibration at f: with 50 ms, a third at 20 Hz, a fifth at 30 Hz), short beside the staging hold. Written
        /// last in the configuration frame (LOG-FORMAT.md, 0x01).</summary>
        public int StillBlockMicros { get; set; }

        /// <summary>Forward acceleration that means motion (mg), averaged over the onset window: the
        /// longer of <see cref="MotionConfirmSamples"/> and a still-test block
        /// (<see cref="RunRecorder.OnsetWindowSamples"/>), so that engine vibration along the car
        /// averages out there as in the still test.</summary>
        public int MotionThresholdMilliG { get; set; }

        /// <summary>Fewest samples in the window that confirms accelerometer onset; the window spans
        /// a still-test block when that holds more (<see cref="MotionThresholdMilliG"/>).</summary>
        public int MotionConfirmSamples { get; set; }

        /// <summary>Time without pulses that ends a run (µs).</summary>
        public int StopHoldMicros { get; set; }

        /// <summary>Bracket width above which an observation counts as wide (µs).</summary>
        public int BracketLimitMicros { get; set; }

        /// <summary>Distance rolled without staging after which a rolling run opens (µm).</summary>
        public int UnstagedOpenMicrometres { get; set; }

        /// <summary>Oldest a pending pulse batch may get before it is written (µs).</summary>
        public int PulseFrameMaxAgeMicros { get; set; }

        /// <summary>Interval between health frames during a run (µs).</summary>
        public int HealthIntervalMicros { get; set; }

        /// <summary>How long the mark button must be held, while staged, to arm a bench rest (µs).
        /// Not in the configuration frame (a run does not depend on it).</summary>
        public int BenchRestHoldMicros { get; set; }

        /// <summary>How long a bench rest records the accelerometer, from the button's release
        /// (µs); written in the rest's own frame (LOG-FORMAT.md, 0x09).</summary>
        public int BenchRestMicros { get; set; }

        /// <summary>Most body bytes in one pulses frame; 0 for as many as a frame holds. A small
        /// value bounds the work of writing one batch in a single loop pass (an interpreted
        /// device stuffs and checksums about 20–50 IL instructions per byte). Not in the
        /// configuration frame: the reader takes frames of any size.</summary>
        public int PulseFrameMaxBodyBytes { get; set; }

        /// <summary>Most pre-trigger samples written per loop pass after a run opens; 0 writes them
        /// all at once. While they drain, newer samples queue behind them in the ring, so the log
        /// keeps its order.</summary>
        public int PreTriggerSamplesPerStep { get; set; }

        /// <summary>Number of pulse channels these settings describe.</summary>
        public int ChannelCount
        {
            get { return SecondChannelEnabled ? 2 : 1; }
        }

        /// <summary>Checks every setting.</summary>
        /// <returns>Null when the settings are usable; otherwise one sentence saying which
        /// setting is wrong, its value and the allowed range.</returns>
        public string Validate()
        {
            string e = Range("PulsesPerRevolution", PulsesPerRevolution, 1, 10000);
            if (e == null) e = Range("CircumferenceMicrometres", CircumferenceMicrometres, 100000, 10000000);
            if (e == null && SecondChannelEnabled) e = Range("SecondPulsesPerRevolution", SecondPulsesPerRevolution, 1, 10000);
            if (e == null && SecondChannelEnabled) e = Range("SecondCircumferenceMicrometres", SecondCircumferenceMicrometres, 100000, 10000000);
            if (e == null) e = Range("RolloutMicrometres", RolloutMicrometres, 0, 10000000);
            if (e == null && AccelPresent) e = Range("AccelOutputDataRateMilliHz", AccelOutputDataRateMilliHz, 1000, 10000000);
            if (e == null && AccelPresent) e = Range("AccelFullScaleMilliG", AccelFullScaleMilliG, 1000, 400000);
            if (e == null) e = Range("ForwardAxis", ForwardAxis, 0, 2);
            if (e == null && AccelPresent) e = Range("PreTriggerSamples", PreTriggerSamples, 1, 100000);
            if (e == null && AccelPresent) e = Range("PreTriggerBursts", PreTriggerBursts, 1, 100000);
            if (e == null) e = Range("StageHoldMicros", StageHoldMicros, 1000, 60000000);
            if (e == null) e = Range("StillBandMilliG", StillBandMilliG, 1, 2000);
            if (e == null) e = Range("StillBlockMicros", StillBlockMicros, MinStillBlockMs * 1000, MaxStillBlockMs * 1000);
            if (e == null) e = Range("MotionThresholdMilliG", MotionThresholdMilliG, 1, 4000);
            if (e == null) e = Range("MotionConfirmSamples", MotionConfirmSamples, 1, 1000);
            if (e == null) e = Range("StopHoldMicros", StopHoldMicros, 10000, 60000000);
            if (e == null) e = Range("BracketLimitMicros", BracketLimitMicros, 1, 1000000);
            if (e == null) e = Range("UnstagedOpenMicrometres", UnstagedOpenMicrometres, 0, 1000000000);
            if (e == null) e = Range("PulseFrameMaxAgeMicros", PulseFrameMaxAgeMicros, 1000, 10000000);
            if (e == null) e = Range("HealthIntervalMicros", HealthIntervalMicros, 10000, 600000000);
            if (e == null && PulseFrameMaxBodyBytes != 0) e = Range("PulseFrameMaxBodyBytes", PulseFrameMaxBodyBytes, 3 * Wire.Varint.MaxBytes, 1000000);
            if (e == null) e = Range("BenchRestHoldMicros", BenchRestHoldMicros, 500000, 60000000);
            if (e == null) e = Range("BenchRestMicros", BenchRestMicros, 1000000, 600000000);
            if (e == null) e = Range("PreTriggerSamplesPerStep", PreTriggerSamplesPerStep, 0, 100000);
            int onsetWindow = RunRecorder.OnsetWindowSamples(this);
            if (e == null && AccelPresent && PreTriggerSamples < onsetWindow)
            {
                // The onset may lie at the window's oldest sample, which the ring must still hold.
                e = "PreTriggerSamples (" + PreTriggerSamples.ToString() + ") must be at least the onset window's " + onsetWindow.ToString()
                    + " samples (MotionConfirmSamples " + MotionConfirmSamples.ToString() + " or StillBlockMicros at the data rate, whichever is more)";
            }

            return e;
        }

        /// <summary>Checks a board's still-block setting, in milliseconds as the boards' settings take
        /// it (the Linux board's <c>accelerometer.still_block_ms</c>, the ESP32's
        /// <c>BoxSettings.StillBlockMs</c>), against the range <see cref="Validate"/> holds
        /// <see cref="StillBlockMicros"/> to.</summary>
        /// <param name="name">The setting's name as its board spells it, for the message.</param>
        /// <param name="milliseconds">Its value.</param>
        /// <returns>Null when usable; otherwise one sentence naming the setting, the allowed range and the value.</returns>
        public static string CheckStillBlockMs(string name, int milliseconds)
        {
            return Range(name, milliseconds, MinStillBlockMs, MaxStillBlockMs);
        }

        private static string Range(string name, int value, int min, int max)
        {
            if (value >= min && value <= max)
            {
                return null;
            }

            return name + " must be from " + min.ToString() + " to " + max.ToString() + " (was " + value.ToString() + ")";
        }
    }
}
