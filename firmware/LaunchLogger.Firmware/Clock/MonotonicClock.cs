using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Clock
{
    /// <summary>64-bit microsecond time built from a 32-bit counter that wraps.</summary>
    /// <remarks>Each wrap is counted in <see cref="HealthCounters.ClockWraps"/>. Read it from one
    /// thread (the capture loop) and at least once per wrap period.</remarks>
    public sealed class MonotonicClock
    {
        private readonly IMicrosecondCounter counter;
        private readonly HealthCounters health;
        private uint lastRaw;
        private long high;

        /// <summary>Starts the 64-bit time at the counter's present value.</summary>
        public MonotonicClock(IMicrosecondCounter counter, HealthCounters health)
        {
            if (counter == null)
            {
                throw new System.ArgumentNullException("counter");
            }

            this.counter = counter;
            this.health = health;
            lastRaw = counter.ReadMicros32();
        }

        /// <summary>Microseconds since the counter's zero, never going backwards.</summary>
        public long NowMicros()
        {
            uint raw = counter.ReadMicros32();
            if (raw < lastRaw)
            {
                high += 0x100000000L;
                if (health != null)
                {
                    health.ClockWraps++;
                }
            }

            lastRaw = raw;
            return high + raw;
        }
    }
}
