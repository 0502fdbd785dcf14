namespace LaunchLogger.Prescribed.Truth;

/// <summary>A speed interval to time: from <paramref name="FromMps"/> (0 = from standstill) to
/// <paramref name="ToMps"/>.</summary>
public sealed record TruthSpeedSpan(double FromMps, double ToMps)
{
    /// <summary>True for an interval from standstill.</summary>
    public bool Standing => FromMps == 0;

    /// <summary>An interval in mph.</summary>
    public static TruthSpeedSpan Mph(double from, double to) => new(from * TruthUnits.MpsPerMph, to * TruthUnits.MpsPerMph);

    /// <summary>An interval in km/h.</summary>
    public static TruthSpeedSpan Kmh(double from, double to) => new(from * TruthUnits.MpsPerKmh, to * TruthUnits.MpsPerKmh);
}

/// <summary>A distance mark to time, with an optional trap ending at it.</summary>
public sealed record TruthDistanceSpan(double DistanceM, double? TrapLengthM)
{
    /// <summary>A mark in feet (trap in feet).</summary>
    public static TruthDistanceSpan Feet(double feet, double? trapFeet = null) =>
        new(feet * TruthUnits.MetresPerFoot, trapFeet * TruthUnits.MetresPerFoot);
}

/// <summary>Which truth figures to compute.</summary>
public sealed record TruthRequest
{
    /// <summary>The speed intervals.</summary>
    public required IReadOnlyList<TruthSpeedSpan> Intervals { get; init; }

    /// <summary>The distance marks.</summary>
    public required IReadOnlyList<TruthDistanceSpan> Marks { get; init; }

    /// <summary>The rollout distance, m.</summary>
    public double RolloutM { get; init; } = TruthUnits.RolloutM;

    /// <summary>The usual figures of the trade: 0–30, 0–60 mph, 0–100, 0–200 km/h; passing
    /// 5–60, 30–50, 50–70 mph and 80–120 km/h; 60, 330, 660 (trap 66), 1000 and 1320 ft (trap
    /// 66) and 100, 200, 400 m (common practice; the strip increments and 66-ft traps as in
    /// shared REFERENCES.md).</summary>
    public static TruthRequest Standard { get; } = new()
    {
        Intervals =
        [
            TruthSpeedSpan.Mph(0, 30), TruthSpeedSpan.Mph(0, 60), TruthSpeedSpan.Kmh(0, 100), TruthSpeedSpan.Kmh(0, 200),
            TruthSpeedSpan.Mph(5, 60), TruthSpeedSpan.Mph(30, 50), TruthSpeedSpan.Mph(50, 70), TruthSpeedSpan.Kmh(80, 120),
        ],
        Marks =
        [
            TruthDistanceSpan.Feet(60), TruthDistanceSpan.Feet(330), TruthDistanceSpan.Feet(660, 66), TruthDistanceSpan.Feet(1000),
            TruthDistanceSpan.Feet(1320, 66), new(100, null), new(200, null), new(400, null),
        ],
    };
}
