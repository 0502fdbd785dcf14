using System;
using System.IO.Ports;
using System.Threading;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Sinks;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>Streams log frames out of COM2 for a laptop to watch live.</summary>
    /// <remarks>The capture loop only copies each frame into the core's fixed
    /// <see cref="ByteRingQueue"/>; a writer thread drains it into the UART. When the ring is full
    /// the whole frame is refused (the reader sees a sequence gap). Port writes have a
    /// <c>WriteTimeout</c>, so a stalled link costs the writer thread a bounded wait and never the
    /// capture loop. The DevKit's own USB port is UART0, which
    /// nanoFramework keeps for deployment and debugging; COM2 reaches the laptop through a
    /// USB-serial adapter (README.md).</remarks>
    public sealed class SerialSink : IByteSink
    {
        private const int ChunkBytes = 256;
        private readonly SerialPort port;
        private readonly ByteRingQueue queue;
        private readonly byte[] chunk = new byte[ChunkBytes];
        private readonly AutoResetEvent dataReady = new AutoResetEvent(false);
        private readonly Thread writer;

        /// <summary>Opens the port and starts the writer thread.</summary>
        public SerialSink(string portName, int baudRate, int bufferBytes, int writeTimeoutMs)
        {
            queue = new ByteRingQueue(bufferBytes);
            port = new SerialPort(portName, baudRate);
            port.WriteTimeout = writeTimeoutMs;
            port.Open();
            writer = new Thread(Drain);
            writer.Start();
        }

        /// <summary>Frames refused because the ring was full.</summary>
        public long FramesRefused
        {
            get { return queue.WritesRefused; }
        }

        /// <summary>Bytes dropped because a write timed out or failed.</summary>
        public long BytesDropped { get; private set; }

        /// <inheritdoc/>
        public bool Write(byte[] buffer, int offset, int count)
        {
            if (!queue.TryWrite(buffer, offset, count))
            {
                return false;
            }

            dataReady.Set();
            return true;
        }

        private void Drain()
        {
            while (true)
            {
                int n = queue.Peek(chunk);
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

                queue.Skip(n);
            }
        }
    }
}
