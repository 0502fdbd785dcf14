namespace LaunchLogger.Cli.Capture;

/// <summary>Where captured bytes come from: the box's serial port, or a test's stand-in.</summary>
public interface ILink
{
    /// <summary>The port's name, for messages.</summary>
    string Name { get; }

    /// <summary>Opens the link.</summary>
    /// <exception cref="LinkLostException">It cannot be opened now (unplugged, busy); try again later.</exception>
    ILinkConnection Open();
}

/// <summary>An open link.</summary>
public interface ILinkConnection : IDisposable
{
    /// <summary>Reads what has arrived, waiting at most the link's read timeout.</summary>
    /// <returns>Bytes read; 0 when nothing arrived in time.</returns>
    /// <exception cref="LinkLostException">The link went away (cable pulled, box powered off).</exception>
    int Read(byte[] buffer);
}

/// <summary>The link is down: it could not be opened, or it went away while open.</summary>
public sealed class LinkLostException(string message, Exception? inner = null) : Exception(message, inner);
