namespace LaunchLogger.Firmware.Run
{
    /// <summary>Counters of everything that went wrong since power-up. Nothing is lost silently:
    /// every component that can lose or distort data counts it here, and the recorder writes
    /// these counters into the log (LOG-FORMAT.md, frame 0x05).</summary>
    public sealed class HealthCounters
    {
        /// <summary>Times the 32-bit microsecond counter rolled over.</summary>
        public long ClockWraps;

        /// <summary>Pulse observations dropped because the capture queue was full.</summary>
        public long PulseObservationsDropped;

        /// <summary>Accelerometer reads that failed.</summary>
        public long AccelReadFailures;

        /// <summary>Times the accelerometer's FIFO overflowed.</summary>
        public long AccelFifoOverflows;

        /// <summary>Observations whose bracket was wider than the configured limit.</summary>
        public long WideBrackets;

        /// <summary>The widest observation bracket seen (µs).</summary>
        public long WidestBracketMicros;

        /// <summary>Observations discarded because the count went backwards.</summary>
        public long CountsWentBackwards;

        /// <summary>Frames the byte sink refused.</summary>
        public long FramesRefused;

        /// <summary>Accelerometer samples at the sensor's full scale on any axis.</summary>
        public long AccelSamplesClipped;

        /// <summary>Returns counter <paramref name="index"/> in the order the health frame uses.</summary>
        public long Get(int index)
        {
            switch (index)
            {
                case 0: return ClockWraps;
                case 1: return PulseObservationsDropped;
                case 2: return AccelReadFailures;
                case 3: return AccelFifoOverflows;
                case 4: return WideBrackets;
                case 5: return WidestBracketMicros;
                case 6: return CountsWentBackwards;
                case 7: return FramesRefused;
                case 8: return AccelSamplesClipped;
                default: return 0;
            }
        }
    }
}
