using System.IO.Ports;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Sinks;

namespace LaunchLogger.Firmware.LinuxBoard.Sinks;

/// <summary>Streams log frames out of a serial port (a USB gadget serial port such as
/// <c>/dev/ttyGS0</c>, or a UART) for a laptop to watch live.</summary>
/// <remarks>
/// <para>The capture loop must never wait on the link, so <see cref="Write"/> only copies the frame
/// into the core's fixed <see cref="ByteRingQueue"/> and returns; a background thread drains the
/// ring into the port. When the ring is full (nobody reading, link too slow) the whole frame is
/// refused and counted — the reader sees a gap in sequence numbers, never half a frame from this
/// cause.</para>
/// <para>Every port write has a <see cref="SerialPort.WriteTimeout"/>: on Linux a write to a port
/// whose peer has gone away otherwise hangs for good, and closing the port can hang after it
/// (HARDWARE-FACTS.md, serial). A timed-out chunk is dropped (the reader's CRC check rejects the
/// cut frame) and writing goes on. If the port itself fails (USB cable pulled) it is closed and
/// reopened once a second until it is back. Modem-control lines are never touched: they are
/// absent on gadget ports and pseudo-terminals, where setting them throws.</para>
/// </remarks>
public sealed class SerialByteSink : IByteSink, IDisposable
{
    private const int ChunkBytes = 4096;
    private const int ReopenDelayMs = 1000;
    private readonly string portName;
    private readonly int baudRate;
    private readonly int writeTimeoutMs;
    private readonly TextWriter errors;
    private readonly ByteRingQueue queue;
    private readonly byte[] chunk = new byte[ChunkBytes];
    private readonly AutoResetEvent dataReady = new(false);
    private readonly Thread writer;
    private SerialPort? port;
    private volatile bool stopping;
    private bool disposed;

    /// <summary>Opens the port and starts the writer thread.</summary>
    /// <param name="portName">Device path, e.g. <c>/dev/ttyGS0</c> or <c>/dev/ttyAMA0</c>.</param>
    /// <param name="baudRate">Line speed (ignored by USB gadget ports and pseudo-terminals).</param>
    /// <param name="writeTimeoutMs">The longest one port write may block.</param>
    /// <param name="bufferBytes">Ring buffer size: how much the link may fall behind.</param>
    /// <param name="errors">Where link trouble is reported (once per failure).</param>
    /// <exception cref="IOException">The port cannot be opened; the message says why.</exception>
    public SerialByteSink(string portName, int baudRate = 115200, int writeTimeoutMs = 250, int bufferBytes = 65536, TextWriter? errors = null)
    {
        ArgumentException.ThrowIfNullOrEmpty(portName);
        ArgumentOutOfRangeException.ThrowIfLessThan(writeTimeoutMs, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(bufferBytes, 1024);
        this.portName = portName;
        this.baudRate = baudRate;
        this.writeTimeoutMs = writeTimeoutMs;
        this.errors = errors ?? TextWriter.Null;
        queue = new ByteRingQueue(bufferBytes);
        port = OpenPort();
        writer = new Thread(Drain) { IsBackground = true, Name = "serial log stream" };
        writer.Start();
    }

    /// <summary>Frames refused because the ring buffer was full.</summary>
    public long FramesRefused => queue.WritesRefused;

    /// <summary>Bytes dropped because a port write timed out or the port failed: an upper bound.
    /// A timed-out chunk is counted whole, but System.IO.Ports' Unix stream times a write out by
    /// cancelling it, which races its I/O thread, so some or all of such a chunk may have gone out
    /// (the same race loses bytes on the reading side; DEVELOPERS.md, serial capture).</summary>
    public long BytesDropped { get; private set; }

    /// <summary>Bytes written to the port.</summary>
    public long BytesSent { get; private set; }

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

    /// <summary>Sends what is buffered (waiting at most about one write timeout per chunk),
    /// stops the writer thread and closes the port.</summary>
    public void Dispose()
    {
        if (disposed)
        {
            return;
        }

        disposed = true;
        stopping = true;
        dataReady.Set();
        writer.Join();
        port?.Close();
        port = null;
        dataReady.Dispose();
    }

    private SerialPort OpenPort()
    {
        var serial = new SerialPort(portName, baudRate, Parity.None, 8, StopBits.One)
        {
            Handshake = Handshake.None,
            WriteTimeout = writeTimeoutMs,
            ReadTimeout = writeTimeoutMs,
        };
        try
        {
            serial.Open();
            return serial;
        }
        catch (Exception e) when (e is UnauthorizedAccessException or IOException or ArgumentException)
        {
            serial.Dispose();
            string cause = e.InnerException == null ? e.Message : e.Message + " (" + e.InnerException.Message + ")";
            throw new IOException("cannot open serial port " + portName + ": " + cause, e);
        }
    }

    private void Drain()
    {
        while (true)
        {
            int n = queue.Peek(chunk);
            if (n == 0)
            {
                if (stopping)
                {
                    return;
                }

                dataReady.WaitOne(100);
                continue;
            }

            bool sent = SendChunk(n);
            queue.Skip(n);
            if (stopping && !sent)
            {
                // Shutting down with a stuck link: drop the rest rather than wait on it.
                BytesDropped += queue.Clear();
            }
        }
    }

    private bool SendChunk(int n)
    {
        if (port == null && !TryReopen())
        {
            BytesDropped += n;
            return false;
        }

        try
        {
            port!.Write(chunk, 0, n);
            BytesSent += n;
            return true;
        }
        catch (TimeoutException)
        {
            BytesDropped += n;
            return false;
        }
        catch (Exception e) when (e is IOException or InvalidOperationException or ObjectDisposedException)
        {
            BytesDropped += n;
            errors.WriteLine("serial stream: " + portName + " failed (" + e.Message + "); reopening");
            port?.Dispose();
            port = null;
            return false;
        }
    }

    private bool TryReopen()
    {
        if (stopping)
        {
            return false;
        }

        Thread.Sleep(ReopenDelayMs);
        try
        {
            port = OpenPort();
            errors.WriteLine("serial stream: " + portName + " reopened");
            return true;
        }
        catch (IOException)
        {
            return false;
        }
    }
}
