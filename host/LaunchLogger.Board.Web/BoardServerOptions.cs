using LaunchLogger.Cli.Output;

namespace LaunchLogger.Board.Web;

/// <summary>How <see cref="BoardServer"/> serves an archive.</summary>
public sealed record BoardServerOptions
{
    /// <summary>The port used when none is given.</summary>
    public const int DefaultPort = 8760;

    /// <summary>The archive file (opened read-only; it must exist).</summary>
    public required string ArchivePath { get; init; }

    /// <summary>TCP port; 0 asks the system for a free one (the real address is in <see cref="BoardServer.Address"/>).</summary>
    public int Port { get; init; } = DefaultPort;

    /// <summary>False: 127.0.0.1 only, no key needed. True: every interface, and every request
    /// must carry the key made at start-up.</summary>
    public bool Lan { get; init; }

    /// <summary>The event shown when the page does not name one; null for every run.</summary>
    public string? Event { get; init; }

    /// <summary>Units on the pages.</summary>
    public DisplayUnits Units { get; init; } = DisplayUnits.Imperial;

    /// <summary>How often the archive's change stamp is read.</summary>
    public TimeSpan Poll { get; init; } = TimeSpan.FromMilliseconds(500);

    /// <summary>How often an idle update stream sends a comment line, so proxies and browsers keep it open.</summary>
    public TimeSpan Heartbeat { get; init; } = TimeSpan.FromSeconds(15);

    /// <summary>The tool version shown on the pages.</summary>
    public required string ToolVersion { get; init; }
}
