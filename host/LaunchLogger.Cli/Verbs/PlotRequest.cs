namespace LaunchLogger.Cli.Verbs;

/// <summary>What <c>launchlogger plot</c> was asked, typed.</summary>
public sealed record PlotRequest
{
    /// <summary>Log files.</summary>
    public IReadOnlyList<FileInfo> Logs { get; init; } = [];

    /// <summary>The picture to write (.svg or .png); several runs get NAME-runN files.</summary>
    public required string Out { get; init; }

    /// <summary>trace, launch, overlay or braking.</summary>
    public string Kind { get; init; } = "trace";

    /// <summary>For an overlay: standstill or rollout; null for the default (standstill).</summary>
    public string? Align { get; init; }

    /// <summary>Run numbers to draw, from 1; empty for every run.</summary>
    public IReadOnlyList<int> Runs { get; init; } = [];

    /// <summary>Units on the axes.</summary>
    public DisplayUnits Units { get; init; } = DisplayUnits.Imperial;

    /// <summary>Picture size as typed, WIDTHxHEIGHT.</summary>
    public string Size { get; init; } = "960x720";

    /// <summary>Rollout distance override, m.</summary>
    public double? RolloutM { get; init; }

    /// <summary>Calibration settings file to apply to every run.</summary>
    public FileInfo? Settings { get; init; }
}
