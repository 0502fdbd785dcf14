using System;
using System.IO.Ports;
using System.Threading;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>Streams log frames out of COM2 for a laptop to watch live.</summary>
    /// <remarks>The capture loop only copies each frame into a fixed ring buffer; a writer thread
    /// drains it into the UART. When the ring is full the whole frame is refused (the reader sees a
    /// sequence gap). Port writes have a <c>WriteTimeout</c>, so a stalled link costs the writer
    /// thread a bounded wait and never the capture loop. The DevKit's own USB port is UART0, which
    /// nanoFramework keeps for deployment and debugging; COM2 reaches the laptop through a
    /// USB-serial adapter (README.md).</remarks>
    public sealed class SerialSink : IByteSink
    {
        private const int ChunkBytes = 256;
        private readonly SerialPort port;
        private readonly byte[] ring;
        private readonly byte[] chunk = new byte[ChunkBytes];
        private readonly object sync = new object();
        private readonly AutoResetEvent dataReady = new AutoResetEvent(false);
        private readonly Thread writer;
        private int head;
        private int count;

        /// <summary>Opens the port and starts the writer thread.</summary>
        public SerialSink(string portName, int baudRate, int bufferBytes, int writeTimeoutMs)
        {
            ring = new byte[bufferBytes];
            port = new SerialPort(portName, baudRate);
            port.WriteTimeout = writeTimeoutMs;
            port.Open();
            writer = new Thread(Drain);
            writer.Start();
        }

        /// <summary>Frames refused because the ring was full.</summary>
        public long FramesRefused { get; private set; }

        /// <summary>Bytes dropped because a write timed out or failed.</summary>
        public long BytesDropped { get; private set; }

        /// <inheritdoc/>
        public bool Write(byte[] buffer, int offset, int count)
        {
            lock (sync)
            {
                if (this.count + count > ring.Length)
                {
                    FramesRefused++;
                    return false;
                }

                int tail = (head + this.count) % ring.Length;
                int first = ring.Length - tail;
                if (first > count)
                {
                    first = count;
                }

                Array.Copy(buffer, offset, ring, tail, first);
                Array.Copy(buffer, offset + first, ring, 0, count - first);
                this.count += count;
            }

            dataReady.Set();
            return true;
        }

        private void Drain()
        {
            while (true)
            {
                int n;
                lock (sync)
                {
                    n = count;
                    if (n > ChunkBytes)
                    {
                        n = ChunkBytes;
                    }

                    if (n > ring.Length - head)
                    {
                        n = ring.Length - head;
                    }

                    Array.Copy(ring, head, chunk, 0, n);
                }

                if (n == 0)
                {
                    dataReady.WaitOne(100, false);
                    continue;
                }

                try
                {
                    port.Write(chunk, 0, n);
                }
                catch (Exception)
                {
                    // Timeout or a port fault: drop the chunk; the reader's CRC check rejects the
                    // cut frame and resynchronises at the next delimiter.
                    BytesDropped += n;
                }

                lock (sync)
                {
                    head = (head + n) % ring.Length;
                    count -= n;
                }
            }
        }
    }
}
