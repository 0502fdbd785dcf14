namespace LaunchLogger.Firmware.Run
{
    /// <summary>The bounds that keep one pass of the capture loop short on an interpreted device
    /// (nanoFramework on an ESP32), and the settings and loop options that apply them. The figures
    /// they give, measured on nanoFramework's interpreter, are in
    /// hardware-notes/esp32-and-linux-boards.md.</summary>
    public static class StepBudget
    {
        /// <summary>The most IL instructions one pass may execute on the interpreter (the largest
        /// measured, the pass that opens a run, is 15,660 with both switch inputs, 2026-12-04 evening): 6–24 ms at 0.4–1.5 µs per
        /// instruction. Checked by a test with an instrumented interpreter.</summary>
        public const int MaxInstructionsPerStep = 16000;

        /// <summary>Most body bytes in one pulses frame.</summary>
        public const int PulseFrameMaxBodyBytes = 64;

        /// <summary>Most pre-trigger samples written per pass after a run opens.</summary>
        public const int PreTriggerSamplesPerStep = 8;

        /// <summary>Most accelerometer samples read per pass.</summary>
        public const int AccelSamplesPerStep = 8;

        /// <summary>How often the accelerometer's FIFO is read (µs): 4 samples at 400 Hz, so a
        /// read normally empties it within <see cref="AccelSamplesPerStep"/>.</summary>
        public const int AccelIntervalMicros = 10000;

        /// <summary>Sets the frame-size and pre-trigger bounds on <paramref name="settings"/>.</summary>
        public static void Apply(LoggerSettings settings)
        {
            settings.PulseFrameMaxBodyBytes = PulseFrameMaxBodyBytes;
            settings.PreTriggerSamplesPerStep = PreTriggerSamplesPerStep;
        }

        /// <summary>Sets the per-pass accelerometer bound on <paramref name="loop"/>.</summary>
        public static void Apply(CaptureLoop loop)
        {
            loop.MaxAccelSamplesPerStep = AccelSamplesPerStep;
        }
    }
}
