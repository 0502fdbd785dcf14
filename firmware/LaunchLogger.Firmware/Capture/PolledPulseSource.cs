using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Capture
{
    /// <summary>Turns a polled hardware edge counter into observations: each change of a count
    /// between two polls becomes "count N reached in (previous poll, this poll]".</summary>
    /// <remarks>The clock is read both before and after the counter, and the bracket runs from the
    /// previous poll's first reading to this poll's second, so an edge that lands while the counter
    /// is being read still falls inside its bracket.</remarks>
    public sealed class PolledPulseSource : IPulseSource
    {
        private readonly IPulseCounter counter;
        private readonly MonotonicClock clock;
        private readonly long[] lastCount;
        private readonly PulseObservation[] pending;
        private long lastPollBeforeMicros;
        private int pendingCount;
        private int pendingRead;

        /// <summary>Takes the counter's present values as the starting point.</summary>
        public PolledPulseSource(IPulseCounter counter, MonotonicClock clock)
        {
            if (counter == null || clock == null)
            {
                throw new System.ArgumentNullException(counter == null ? "counter" : "clock");
            }

            this.counter = counter;
            this.clock = clock;
            int channels = counter.ChannelCount;
            lastCount = new long[channels];
            pending = new PulseObservation[channels];
            lastPollBeforeMicros = clock.NowMicros();
            for (int c = 0; c < channels; c++)
            {
                lastCount[c] = counter.ReadCount(c);
            }
        }

        /// <summary>Reads every channel once; changed channels become waiting observations.</summary>
        public void Poll()
        {
            long before = clock.NowMicros();
            int channels = lastCount.Length;
            pendingCount = 0;
            pendingRead = 0;
            for (int c = 0; c < channels; c++)
            {
                long count = counter.ReadCount(c);
                if (count != lastCount[c])
                {
                    pending[pendingCount].Channel = c;
                    pending[pendingCount].Count = count;
                    pendingCount++;
                    lastCount[c] = count;
                }
            }

            long after = clock.NowMicros();
            for (int i = 0; i < pendingCount; i++)
            {
                pending[i].LoMicros = lastPollBeforeMicros;
                pending[i].HiMicros = after > lastPollBeforeMicros ? after : lastPollBeforeMicros + 1;
            }

            lastPollBeforeMicros = before;
        }

        /// <inheritdoc/>
        public bool TryRead(out PulseObservation observation)
        {
            if (pendingRead < pendingCount)
            {
                int i = pendingRead++;
                PulseObservation.Copy(pending, i, out observation);
                return true;
            }

            PulseObservation.Clear(out observation);
            return false;
        }
    }
}
