using System.IO.Ports;

namespace LaunchLogger.Cli.Capture;

/// <summary>The box's USB serial port through System.IO.Ports.</summary>
/// <remarks>Read and write timeouts are always set: on Linux a read pending when the peer dies
/// throws <see cref="ObjectDisposedException"/> (or <see cref="IOException"/>) while
/// <see cref="SerialPort.IsOpen"/> stays true, and a write without a timeout can hang. Modem-line
/// signals are never touched (pseudo-terminals refuse them). Every such failure is reported as
/// <see cref="LinkLostException"/>, and the port is reopened from scratch.</remarks>
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
            ReadTimeout = readTimeoutMs,
            WriteTimeout = 500,
            ReadBufferSize = 1 << 16,
        };
        try
        {
            port.Open();
            return new Connection(port);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or InvalidOperationException or ArgumentException)
        {
            port.Dispose();
            throw new LinkLostException($"{portName}: cannot open: {(e.InnerException ?? e).Message}", e);
        }
    }

    private sealed class Connection(SerialPort port) : ILinkConnection
    {
        public int Read(byte[] buffer)
        {
            try
            {
                int n = port.Read(buffer, 0, buffer.Length);
                return n > 0 ? n : throw new LinkLostException($"{port.PortName}: the port reported end of data");
            }
            catch (TimeoutException)
            {
                return 0;
            }
            catch (Exception e) when (e is IOException or ObjectDisposedException or InvalidOperationException or UnauthorizedAccessException)
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
        }
    }
}
