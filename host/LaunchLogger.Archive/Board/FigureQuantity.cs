namespace LaunchLogger.Archive.Board;

/// <summary>What a board figure measures.</summary>
public enum FigureQuantity
{
    /// <summary>A duration, s; lower ranks first.</summary>
    Time,

    /// <summary>A speed, m/s; higher ranks first.</summary>
    Speed,

    /// <summary>A distance, m; lower ranks first.</summary>
    Distance,
}
