using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Capture;

/// <summary>How a capture runs.</summary>
public sealed record CaptureOptions
{
    /// <summary>Where the raw bytes go.</summary>
    public required string OutPath { get; init; }

    /// <summary>The archive each closed run is filed in; null: runs are not filed.</summary>
    public string? ArchivePath { get; init; }

    /// <summary>Where filed runs belong.</summary>
    public RunAssignment Assignment { get; init; } = RunAssignment.None;

    /// <summary>Units for the status line.</summary>
    public DisplayUnits Units { get; init; } = DisplayUnits.Imperial;

    /// <summary>JSON lines (one object per closed run and per link event) instead of a status line.</summary>
    public bool Json { get; init; }

    /// <summary>True to rewrite one status line in place (an interactive terminal).</summary>
    public bool Overwrite { get; init; }

    /// <summary>Lists this machine's serial ports, named when the port cannot be opened so a
    /// mistyped or wrong port shows; null: none are listed (a test's own link).</summary>
    public Func<IReadOnlyList<string>>? PortNames { get; init; }

    /// <summary>How long to wait between attempts to reopen a lost port.</summary>
    public TimeSpan ReopenEvery { get; init; } = TimeSpan.FromMilliseconds(250);

    /// <summary>Least time between status lines when they are not rewritten in place.</summary>
    public TimeSpan StatusEvery { get; init; } = TimeSpan.FromSeconds(1);
}
