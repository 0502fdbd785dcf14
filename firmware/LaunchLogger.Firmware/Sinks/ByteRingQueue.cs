namespace LaunchLogger.Firmware.Sinks
{
    /// <summary>A fixed ring of bytes between the capture loop, which adds whole frames, and a
    /// writer thread, which sends them to a slow link (a serial port).</summary>
    /// <remarks>
    /// <para>The capture loop must never wait on the link: <see cref="TryWrite"/> only copies into
    /// the ring, and refuses a frame whole when it does not fit, so a reader of the stream sees a
    /// gap in sequence numbers, never half a frame from this cause.</para>
    /// <para>The writer thread takes bytes in two steps: <see cref="Peek"/> copies from the front
    /// without removing (so the ring is not locked while the port write blocks), then
    /// <see cref="Skip"/> removes what was sent or dropped. One writer and one reader thread; every
    /// member locks. The ring is allocated once.</para>
    /// </remarks>
    public sealed class ByteRingQueue
    {
        private readonly byte[] ring;
        private readonly object sync = new object();
        private int head;
        private int count;
        private long writesRefused;

        /// <summary>Allocates room for <paramref name="capacity"/> bytes once.</summary>
        /// <exception cref="System.ArgumentOutOfRangeException">A capacity below 1.</exception>
        public ByteRingQueue(int capacity)
        {
            if (capacity < 1)
            {
                throw new System.ArgumentOutOfRangeException("capacity");
            }

            ring = new byte[capacity];
        }

        /// <summary>The most bytes the ring holds.</summary>
        public int Capacity
        {
            get { return ring.Length; }
        }

        /// <summary>Bytes waiting.</summary>
        public int Count
        {
            get
            {
                lock (sync)
                {
                    return count;
                }
            }
        }

        /// <summary>Writes refused because they did not fit.</summary>
        public long WritesRefused
        {
            get
            {
                lock (sync)
                {
                    return writesRefused;
                }
            }
        }

        /// <summary>Adds <paramref name="length"/> bytes, all or none.</summary>
        /// <returns>False (and counted) when they do not fit.</returns>
        public bool TryWrite(byte[] buffer, int offset, int length)
        {
            lock (sync)
            {
                if (count + length > ring.Length)
                {
                    writesRefused++;
                    return false;
                }

                int tail = (head + count) % ring.Length;
                int first = ring.Length - tail;
                if (first > length)
                {
                    first = length;
                }

                System.Array.Copy(buffer, offset, ring, tail, first);
                System.Array.Copy(buffer, offset + first, ring, 0, length - first);
                count += length;
                return true;
            }
        }

        /// <summary>Copies up to <paramref name="destination"/>.Length bytes from the front into
        /// <paramref name="destination"/> without removing them: at most the part that runs
        /// unbroken up to the end of the ring (the rest comes with the next call).</summary>
        /// <returns>Bytes copied; 0 when the ring is empty.</returns>
        public int Peek(byte[] destination)
        {
            lock (sync)
            {
                int n = count;
                if (n > destination.Length)
                {
                    n = destination.Length;
                }

                if (n > ring.Length - head)
                {
                    n = ring.Length - head;
                }

                System.Array.Copy(ring, head, destination, 0, n);
                return n;
            }
        }

        /// <summary>Removes <paramref name="length"/> bytes from the front (no more than are waiting).</summary>
        public void Skip(int length)
        {
            lock (sync)
            {
                if (length > count)
                {
                    length = count;
                }

                head = (head + length) % ring.Length;
                count -= length;
            }
        }

        /// <summary>Removes everything waiting.</summary>
        /// <returns>How many bytes were removed.</returns>
        public int Clear()
        {
            lock (sync)
            {
                int removed = count;
                head = (head + count) % ring.Length;
                count = 0;
                return removed;
            }
        }
    }
}
