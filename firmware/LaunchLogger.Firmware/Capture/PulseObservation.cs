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

        /// <summary>Copies element <paramref name="index"/> of <paramref name="from"/> field by
        /// field. On the device every by-value load of a struct (an array element, a local, an
        /// argument) is copied into a new heap object; field loads through the element's address
        /// are not.</summary>
        public static void Copy(PulseObservation[] from, int index, out PulseObservation to)
        {
            to.Channel = from[index].Channel;
            to.Count = from[index].Count;
            to.LoMicros = from[index].LoMicros;
            to.HiMicros = from[index].HiMicros;
        }

        /// <summary>Zeroes every field in place (no struct is built and copied).</summary>
        public static void Clear(out PulseObservation observation)
        {
            observation.Channel = 0;
            observation.Count = 0;
            observation.LoMicros = 0;
            observation.HiMicros = 0;
        }
    }
}
