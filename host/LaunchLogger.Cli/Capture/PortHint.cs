namespace LaunchLogger.Cli.Capture;

/// <summary>What capture tells a person about this machine's serial ports: when no
/// <c>--port</c> is given, and when the one given cannot be opened.</summary>
public static class PortHint
{
    /// <summary>How to name a port, with an example for each kind of system.</summary>
    public const string HowToName = "name the box's port with --port PORT, e.g. launchlogger capture --port /dev/ttyACM0 (COM3 on Windows)";

    /// <summary>The ports found, or that none were, in one clause.</summary>
    public static string Found(IReadOnlyList<string> ports)
    {
        ArgumentNullException.ThrowIfNull(ports);
        return ports.Count == 0
            ? "no serial ports found on this machine (plug the box in; pseudo-terminals are not listed but work with --port)"
            : "serial ports on this machine: " + string.Join(", ", ports);
    }
}
