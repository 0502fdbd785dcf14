namespace LaunchLogger.Plots;

/// <summary>The file a chart is written as.</summary>
public enum ChartFormat
{
    /// <summary>Scalable vector graphics, self-contained (no external fonts or images).</summary>
    Svg,

    /// <summary>A PNG raster of the chart's pixel size.</summary>
    Png,
}

/// <summary>Picks a <see cref="ChartFormat"/> from a file name.</summary>
public static class ChartFormats
{
    /// <summary>The format a path's extension names (.svg or .png, any case); null for any other.</summary>
    public static ChartFormat? FromPath(string path) => Path.GetExtension(path).ToLowerInvariant() switch
    {
        ".svg" => ChartFormat.Svg,
        ".png" => ChartFormat.Png,
        _ => null,
    };
}
