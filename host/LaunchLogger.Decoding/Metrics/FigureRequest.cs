namespace LaunchLogger.Decoding.Metrics;

/// <summary>Which figures to compute. <see cref="Standard"/> holds the set every report shows.</summary>
public sealed record FigureRequest
{
    /// <summary>Speed intervals from standstill, rolling and passing intervals, in report order.</summary>
    public required IReadOnlyList<SpeedInterval> SpeedIntervals { get; init; }

    /// <summary>Distance marks, in report order.</summary>
    public required IReadOnlyList<DistanceMark> DistanceMarks { get; init; }

    /// <summary>The standard set: 0–30 and 0–60 mph, 0–100 and 0–200 km/h, rolling 5–60 mph,
    /// passing 30–50 and 50–70 mph and 80–120 km/h; 60, 330, 660, 1000 and 1320 ft with 66-ft
    /// traps before 660 and 1320 ft, and 100, 200 and 400 m.</summary>
    public static FigureRequest Standard { get; } = new()
    {
        SpeedIntervals =
        [
            SpeedInterval.Mph(0, 30),
            SpeedInterval.Mph(0, 60),
            SpeedInterval.Kmh(0, 100),
            SpeedInterval.Kmh(0, 200),
            SpeedInterval.Mph(5, 60),
            SpeedInterval.Mph(30, 50),
            SpeedInterval.Mph(50, 70),
            SpeedInterval.Kmh(80, 120),
        ],
        DistanceMarks =
        [
            DistanceMark.Feet("60 ft", 60),
            DistanceMark.Feet("330 ft", 330),
            DistanceMark.Feet("660 ft (1/8 mile)", 660, 66),
            DistanceMark.Feet("1000 ft", 1000),
            DistanceMark.Feet("1320 ft (1/4 mile)", 1320, 66),
            DistanceMark.Metres(100),
            DistanceMark.Metres(200),
            DistanceMark.Metres(400),
        ],
    };

    /// <summary>The standard set plus extra speed intervals (e.g. from --interval).</summary>
    public FigureRequest With(IEnumerable<SpeedInterval> extra) =>
        this with { SpeedIntervals = [.. SpeedIntervals, .. extra] };
}
