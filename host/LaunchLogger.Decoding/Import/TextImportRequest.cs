namespace LaunchLogger.Decoding.Import;

/// <summary>What to import from plain text: the command line's <c>--edges</c>, <c>--counts</c>,
/// <c>--accel</c> files and the pulse scale.</summary>
public sealed record TextImportRequest
{
    /// <summary>Pulse edge times (header <c>t_s</c>), or null.</summary>
    public string? EdgesPath { get; init; }

    /// <summary>Bracketed cumulative counts (header <c>t_lo_s,t_hi_s,count</c>), or null.</summary>
    public string? CountsPath { get; init; }

    /// <summary>Accelerometer samples (header <c>t_s,ax_mps2[,ay_mps2,az_mps2]</c>), or null.</summary>
    public string? AccelPath { get; init; }

    /// <summary>Distance per pulse; required with edges or counts.</summary>
    public PulseScale? Scale { get; init; }
}
