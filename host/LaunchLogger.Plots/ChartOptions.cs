using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Plots;

/// <summary>How a chart is drawn: the units people read, and the picture's size.</summary>
public sealed record ChartOptions
{
    /// <summary>Default picture width, pixels.</summary>
    public const int DefaultWidthPx = 960;

    /// <summary>Default picture height, pixels.</summary>
    public const int DefaultHeightPx = 720;

    /// <summary>Speed and distance units on the axes.</summary>
    public DisplayUnits Units { get; init; } = DisplayUnits.Imperial;

    /// <summary>Picture width, pixels (SVG user units), 200 to 8000.</summary>
    public int WidthPx { get; init; } = DefaultWidthPx;

    /// <summary>Picture height, pixels (SVG user units), 200 to 8000.</summary>
    public int HeightPx { get; init; } = DefaultHeightPx;

    /// <summary>A heading above the chart; null for the chart's own (e.g. "Run 3").</summary>
    public string? Title { get; init; }

    /// <summary>The smallest and largest size accepted, pixels.</summary>
    public const int MinSizePx = 200, MaxSizePx = 8000;

    /// <summary>Checks the size.</summary>
    /// <exception cref="ArgumentOutOfRangeException">Width or height is outside 200 to 8000.</exception>
    public void Validate()
    {
        if (WidthPx is < MinSizePx or > MaxSizePx)
        {
            throw new ArgumentOutOfRangeException(nameof(WidthPx), WidthPx, $"width must be {MinSizePx} to {MaxSizePx} pixels");
        }

        if (HeightPx is < MinSizePx or > MaxSizePx)
        {
            throw new ArgumentOutOfRangeException(nameof(HeightPx), HeightPx, $"height must be {MinSizePx} to {MaxSizePx} pixels");
        }
    }
}
