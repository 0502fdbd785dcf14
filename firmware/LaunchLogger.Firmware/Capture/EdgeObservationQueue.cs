using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Capture
{
    /// <summary>A fixed queue between whatever timestamps edges (an interrupt, a kernel event
    /// reader thread) and the capture loop. Full means dropped, and dropped is counted.</summary>
    public sealed class EdgeObservationQueue : IPulseSource
    {
        private readonly PulseObservation[] ring;
        private readonly HealthCounters health;
        private readonly object sync = new object();
        private int head;
        private int count;

        /// <summary>Allocates room for <paramref name="capacity"/> observations once.</summary>
        public EdgeObservationQueue(int capacity, HealthCounters health)
        {
            if (capacity < 1)
            {
                throw new System.ArgumentOutOfRangeException("capacity");
            }

            ring = new PulseObservation[capacity];
            this.health = health;
        }

        /// <summary>Queues one observation; returns false (and counts it) when the queue is full.</summary>
        public bool TryWrite(int channel, long count, long loMicros, long hiMicros)
        {
            lock (sync)
            {
                if (this.count == ring.Length)
                {
                    if (health != null)
                    {
                        health.PulseObservationsDropped++;
                    }

                    return false;
                }

                int slot = (head + this.count) % ring.Length;
                ring[slot].Channel = channel;
                ring[slot].Count = count;
                ring[slot].LoMicros = loMicros;
                ring[slot].HiMicros = hiMicros;
                this.count++;
                return true;
            }
        }

        /// <summary>Queues one exactly timestamped edge: a bracket one microsecond wide ending at
        /// <paramref name="edgeMicros"/>.</summary>
        public bool TryWriteEdge(int channel, long count, long edgeMicros)
        {
            return TryWrite(channel, count, edgeMicros - 1, edgeMicros);
        }

        /// <inheritdoc/>
        public bool TryRead(out PulseObservation observation)
        {
            lock (sync)
            {
                if (count == 0)
                {
                    PulseObservation.Clear(out observation);
                    return false;
                }

                PulseObservation.Copy(ring, head, out observation);
                head = (head + 1) % ring.Length;
                count--;
                return true;
            }
        }
    }
}
