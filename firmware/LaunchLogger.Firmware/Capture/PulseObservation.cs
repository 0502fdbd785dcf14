namespace LaunchLogger.Firmware.Capture
{
    /// <summary>"The cumulative pulse count of a channel reached <see cref="Count"/> at some time
    /// t with <see cref="LoMicros"/> &lt; t ≤ <see cref="HiMicros"/>."</summary>
    /// <remarks>The one capture model for every board. Exact edge timestamps give brackets one
    /// tick wide; a polled hardware counter gives brackets one poll period wide, and the count may
    /// rise by more than one inside it.</remarks>
    public struct PulseObservation
    {
        /// <summary>Pulse channel: 0 is the distance channel, 1 the optional second wheel.</summary>
        public int Channel;

        /// <summary>The cumulative count reached (the hardware counter's value).</summary>
        public long Count;

        /// <summary>Bracket start (exclusive), µs of the monotonic clock.</summary>
        public long LoMicros;

        /// <summary>Bracket end (inclusive), µs of the monotonic clock.</summary>
        public long HiMicros;
    }
}
