namespace LaunchLogger.Firmware.Capture
{
    /// <summary>Accepts a new input level only after it has held for a while, so contact bounce
    /// and ignition noise on a switch wire do not show up as extra presses.</summary>
    /// <remarks>Fed by polling (brake switch, mark button); the caller supplies the time, so the
    /// same logic serves any board's clock. A level accepted after its hold is dated back to the
    /// reading that first saw it (<see cref="ChangedAtMicros"/>), with the reading before that
    /// (<see cref="ChangeGapMicros"/>): the input changed somewhere in between.</remarks>
    public sealed class Debouncer
    {
        private readonly long holdMicros;
        private bool state;
        private long changedAtMicros;
        private long changeGapMicros;
        private bool candidate;
        private long candidateSinceMicros;
        private long candidateGapMicros;
        private long lastReadMicros;
        private bool read;

        /// <summary>Starts in <paramref name="initial"/> with the given hold time.</summary>
        /// <exception cref="System.ArgumentOutOfRangeException">A negative hold time.</exception>
        public Debouncer(long holdMicros, bool initial)
        {
            if (holdMicros < 0)
            {
                throw new System.ArgumentOutOfRangeException("holdMicros");
            }

            this.holdMicros = holdMicros;
            state = initial;
            candidate = initial;
        }

        /// <summary>The debounced level.</summary>
        public bool State
        {
            get { return state; }
        }

        /// <summary>When the reading that first saw the present level was taken (µs; 0 before
        /// any change).</summary>
        public long ChangedAtMicros
        {
            get { return changedAtMicros; }
        }

        /// <summary>Time from the reading before that one to it (µs): the level changed within
        /// this much before <see cref="ChangedAtMicros"/>; 0 when there was no earlier reading.</summary>
        public long ChangeGapMicros
        {
            get { return changeGapMicros; }
        }

        /// <summary>Feeds a raw reading taken at <paramref name="nowMicros"/>; returns the debounced level.</summary>
        /// <remarks>Called for every input on every pass of the device's loop: fields, not
        /// properties, inside (each property access is a call on the interpreter).</remarks>
        public bool Update(bool raw, long nowMicros)
        {
            if (raw != candidate)
            {
                candidate = raw;
                candidateSinceMicros = nowMicros;
                candidateGapMicros = read ? nowMicros - lastReadMicros : 0;
            }

            read = true;
            lastReadMicros = nowMicros;
            if (candidate != state && nowMicros - candidateSinceMicros >= holdMicros)
            {
                state = candidate;
                changedAtMicros = candidateSinceMicros;
                changeGapMicros = candidateGapMicros;
            }

            return state;
        }
    }
}
