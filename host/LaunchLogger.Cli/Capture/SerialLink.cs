using System.IO.Ports;

namespace LaunchLogger.Cli.Capture;

/// <summary>The box's USB serial port through System.IO.Ports.</summary>
/// <remarks>Read and write timeouts are always set: on Linux a read pending when the peer dies
/// throws <see cref="ObjectDisposedException"/> (or <see cref="IOException"/>) while
/// <see cref="SerialPort.IsOpen"/> stays true, and a write without a timeout can hang. Modem-line
/// signals are never touched (pseudo-terminals refuse them). Every such failure is reported as
/// <see cref="LinkLostException"/>, and the port is reopened from scratch.
/// <para>Reads are never timed out inside System.IO.Ports. Its Unix stream times a read out by
/// cancelling the request, and that races its I/O thread: when the cancel lands after the thread
/// has taken the bytes from the device but before it hands them over, the read reports a timeout
/// and the bytes (up to a whole block) are gone. So each connection keeps one read outstanding,
/// with no timeout, into a buffer of its own; <see cref="ILinkConnection.Read"/> waits for it at
/// most <c>readTimeoutMs</c> and, if it has not finished, leaves it running for the next call.
/// Closing the port, or the peer going away, ends that read with an error.</para></remarks>
public sealed class SerialLink(string portName, int baudRate, int readTimeoutMs = 200) : ILink
{
    /// <inheritdoc />
    public string Name => portName;

    /// <summary>The serial ports the system lists (pseudo-terminals are not listed).</summary>
    public static IReadOnlyList<string> PortNames() => SerialPort.GetPortNames().Order(StringComparer.Ordinal).ToList();

    /// <inheritdoc />
    public ILinkConnection Open()
    {
        var port = new SerialPort(portName, baudRate, Parity.None, 8, StopBits.One)
        {
            Handshake = Handshake.None,

            // No ReadTimeout: reads are never timed out inside the port (see the remarks); the
            // connection waits for its outstanding read at most readTimeoutMs itself.
            WriteTimeout = 500,
            ReadBufferSize = 1 << 16,
        };
        try
        {
            port.Open();
            return new Connection(port, readTimeoutMs);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or InvalidOperationException or ArgumentException)
        {
            port.Dispose();
            throw new LinkLostException($"{portName}: cannot open: {(e.InnerException ?? e).Message}", e);
        }
    }

    private sealed class Connection(SerialPort port, int waitMs) : ILinkConnection
    {
        private const int LandingBytes = 4096;
        private readonly byte[] landing = new byte[LandingBytes];
        private Task<int>? outstanding;
        private int landedAt;
        private int landedCount;

        public int Read(byte[] buffer)
        {
            try
            {
                if (landedCount == 0)
                {
                    // No cancellation token, no timeout: only bytes or an error end this read.
                    outstanding ??= port.BaseStream.ReadAsync(landing, 0, landing.Length, CancellationToken.None);
                    if (!Finished(outstanding))
                    {
                        return 0;
                    }

                    Task<int> done = outstanding;
                    outstanding = null;
                    int n = done.GetAwaiter().GetResult();
                    if (n <= 0)
                    {
                        throw new LinkLostException($"{port.PortName}: the port reported end of data");
                    }

                    landedAt = 0;
                    landedCount = n;
                }

                // A caller's buffer smaller than the landing one takes the rest on its next call.
                int given = Math.Min(landedCount, buffer.Length);
                landing.AsSpan(landedAt, given).CopyTo(buffer);
                landedAt += given;
                landedCount -= given;
                return given;
            }
            catch (Exception e) when (e is IOException or ObjectDisposedException or InvalidOperationException or UnauthorizedAccessException or OperationCanceledException)
            {
                throw new LinkLostException($"{port.PortName}: link lost: {e.Message}", e);
            }
        }

        public void Dispose()
        {
            try
            {
                port.Dispose();
            }
            catch (Exception e) when (e is IOException or ObjectDisposedException or InvalidOperationException)
            {
                // The port is gone already; nothing is left to release.
            }

            // Closing the port ends the outstanding read with an error nobody waits for.
            outstanding?.ContinueWith(static t => _ = t.Exception, CancellationToken.None, TaskContinuationOptions.OnlyOnFaulted | TaskContinuationOptions.ExecuteSynchronously, TaskScheduler.Default);
        }

        /// <summary>Whether <paramref name="read"/> has finished within the wait (its fault, if
        /// any, is thrown by whoever takes its result).</summary>
        private bool Finished(Task<int> read)
        {
            try
            {
                return read.Wait(waitMs);
            }
            catch (AggregateException)
            {
                return true;
            }
        }
    }
}
