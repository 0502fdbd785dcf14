namespace LaunchLogger.Firmware.Capture
{
    /// <summary>Accepts a new input level only after it has held for a while, so contact bounce
    /// and ignition noise on a switch wire do not show up as extra presses.</summary>
    /// <remarks>Fed by polling (brake switch, mark button); the caller supplies the time, so the
    /// same logic serves any board's clock.</remarks>
    public sealed class Debouncer
    {
        private readonly long holdMicros;
        private bool candidate;
        private long candidateSinceMicros;

        /// <summary>Starts in <paramref name="initial"/> with the given hold time.</summary>
        /// <exception cref="System.ArgumentOutOfRangeException">A negative hold time.</exception>
        public Debouncer(long holdMicros, bool initial)
        {
            if (holdMicros < 0)
            {
                throw new System.ArgumentOutOfRangeException("holdMicros");
            }

            this.holdMicros = holdMicros;
            State = initial;
            candidate = initial;
        }

        /// <summary>The debounced level.</summary>
        public bool State { get; private set; }

        /// <summary>Feeds a raw reading taken at <paramref name="nowMicros"/>; returns the debounced level.</summary>
        public bool Update(bool raw, long nowMicros)
        {
            if (raw != candidate)
            {
                candidate = raw;
                candidateSinceMicros = nowMicros;
            }

            if (candidate != State && nowMicros - candidateSinceMicros >= holdMicros)
            {
                State = candidate;
            }

            return State;
        }
    }
}
