using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Archive.Board;

/// <summary>The figures the board ranks by.</summary>
/// <remarks>Distances and speeds are exact: 1 ft = 0.3048 m, 1 mile = 1609.344 m,
/// 1 mph = 0.44704 m/s (international yard and pound, 1959). Marks and traps as the strip
/// times them (common practice): 60 ft, 1/8 mile (660 ft) and 1/4 mile (1320 ft) elapsed times,
/// trap speed over the 66 ft before the line.</remarks>
public static class BoardFigures
{
    private const double Foot = Units.MetresPerFoot;
    private const double Mph = Units.MpsPerMph;
    private const double Kmh = Units.MpsPerKmh;
    private const double Tolerance = 1e-6;

    /// <summary>Every figure, in the order they are listed.</summary>
    public static IReadOnlyList<BoardFigure> All { get; } =
    [
        new("0-60mph", "0-60 mph", FigureQuantity.Time, true, r => Interval(r, 60 * Mph)),
        new("0-100kmh", "0-100 km/h", FigureQuantity.Time, true, r => Interval(r, 100 * Kmh)),
        new("60ft", "60-ft time", FigureQuantity.Time, true, r => Mark(r, 60 * Foot)),
        new("330ft", "330-ft time", FigureQuantity.Time, true, r => Mark(r, 330 * Foot)),
        new("eighth", "1/8-mile elapsed time", FigureQuantity.Time, true, r => Mark(r, 660 * Foot)),
        new("quarter", "1/4-mile elapsed time", FigureQuantity.Time, true, r => Mark(r, 1320 * Foot)),
        new("eighth-trap", "1/8-mile trap speed", FigureQuantity.Speed, false, r => Trap(r, 660 * Foot)),
        new("trap", "1/4-mile trap speed", FigureQuantity.Speed, false, r => Trap(r, 1320 * Foot)),
        new("stop", "stopping distance (as braked)", FigureQuantity.Distance, false, Stop),
        new("stop-60", "stopping distance corrected to 60-0 mph", FigureQuantity.Distance, false, r => CorrectedStop(r, 60 * Mph)),
    ];

    /// <summary>The figure with code <paramref name="code"/> (case-insensitive), or null.</summary>
    public static BoardFigure? Find(string code) => All.FirstOrDefault(f => string.Equals(f.Code, code, StringComparison.OrdinalIgnoreCase));

    /// <summary>The codes, for messages.</summary>
    public static string Codes => string.Join(", ", All.Select(f => f.Code));

    private static FigureValue? Interval(RunReport r, double toMps) =>
        r.SpeedIntervals.FirstOrDefault(i => i.FromMps == 0 && Math.Abs(i.ToMps - toMps) < Tolerance) is { } i && (i.FromStandstillS ?? i.FromRolloutS) is not null
            ? new FigureValue(i.FromStandstillS, i.UncertaintyS, i.FromRolloutS, i.FromRolloutUncertaintyS)
            : null;

    private static FigureValue? Mark(RunReport r, double distanceM) =>
        r.DistanceMarks.FirstOrDefault(m => Math.Abs(m.DistanceM - distanceM) < Tolerance) is { } m && (m.FromStandstillS ?? m.FromRolloutS) is not null
            ? new FigureValue(m.FromStandstillS, m.UncertaintyS, m.FromRolloutS, m.FromRolloutUncertaintyS)
            : null;

    private static FigureValue? Trap(RunReport r, double distanceM) =>
        r.DistanceMarks.FirstOrDefault(m => Math.Abs(m.DistanceM - distanceM) < Tolerance) is { TrapSpeedMps: { } v } m
            ? new FigureValue(v, m.TrapSpeedUncertaintyMps, v, m.TrapSpeedUncertaintyMps)
            : null;

    private static FigureValue? Stop(RunReport r) =>
        r.Braking is { } b ? new FigureValue(b.StoppingDistanceM, b.StoppingDistanceUncertaintyM, b.StoppingDistanceM, b.StoppingDistanceUncertaintyM) : null;

    private static FigureValue? CorrectedStop(RunReport r, double nominalMps)
    {
        if (r.Braking is not { } b || b.CorrectedStops.FirstOrDefault(c => Math.Abs(c.NominalMps - nominalMps) < Tolerance) is not { CorrectedDistanceM: { } d })
        {
            return null;
        }

        // The correction scales the distance, so it scales its σ by the same factor.
        double? sigma = b.StoppingDistanceM > 0 ? b.StoppingDistanceUncertaintyM * d / b.StoppingDistanceM : null;
        return new FigureValue(d, sigma, d, sigma);
    }
}
