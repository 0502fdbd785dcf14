using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Cli.Bench;

/// <summary>How a figure of the standard set is read from an interval or a mark.</summary>
public enum FigureConvention
{
    /// <summary>From first motion (or from the start speed of a rolling or passing interval).</summary>
    FromStandstill,

    /// <summary>From the rollout mark.</summary>
    AfterRollout,

    /// <summary>The mean speed over the trap that ends at the mark.</summary>
    TrapSpeed,
}

/// <summary>A figure the accuracy benchmark compares with the truth.</summary>
/// <param name="Name">What it is.</param>
/// <param name="Unit">Unit of the printed errors.</param>
/// <param name="Scale">Factor from SI to that unit.</param>
public sealed record BenchFigure(string Name, string Unit, double Scale)
{
    /// <summary>First motion.</summary>
    public const int FirstMotion = 0;

    /// <summary>The rollout mark.</summary>
    public const int Rollout = 1;

    /// <summary>0–60 mph from standstill.</summary>
    public const int ZeroTo60 = 2;

    /// <summary>0–60 mph after rollout.</summary>
    public const int ZeroTo60AfterRollout = 3;

    /// <summary>Quarter-mile elapsed time from standstill.</summary>
    public const int Quarter = 4;

    /// <summary>Quarter-mile elapsed time after rollout.</summary>
    public const int QuarterAfterRollout = 5;

    /// <summary>Quarter-mile trap speed.</summary>
    public const int Trap = 6;

    /// <summary>30–50 mph.</summary>
    public const int Passing30To50 = 7;

    /// <summary>80–120 km/h.</summary>
    public const int Passing80To120 = 8;

    /// <summary>Stopping distance.</summary>
    public const int StoppingDistance = 9;

    /// <summary>Brake onset.</summary>
    public const int BrakeOnset = 10;

    /// <summary>The rollout mark as the report prints it: after first motion, with the rollout
    /// mark's σ beside it.</summary>
    public const int RolloutAfterFirstMotion = 11;

    /// <summary>Speed at the rollout mark.</summary>
    public const int RolloutSpeed = 12;

    /// <summary>Grade at staging, per cent (the report's ± is the tangent of the angle's σ).</summary>
    public const int Grade = 13;

    /// <summary>The first of the figures read from <see cref="FigureRequest.Standard"/> that the
    /// named constants above do not already hold.</summary>
    public const int FirstOfStandardSet = 14;

    /// <summary>The interval a figure from <see cref="FirstOfStandardSet"/> on is read from, or null.</summary>
    public SpeedInterval? Interval { get; init; }

    /// <summary>The distance mark a figure from <see cref="FirstOfStandardSet"/> on is read from, or null.</summary>
    public DistanceMark? Mark { get; init; }

    /// <summary>Which of the interval's or mark's readings it is.</summary>
    public FigureConvention Convention { get; init; }

    /// <summary>Every figure, indexed by the constants above; then every other figure the report
    /// prints with a ± from the standard set (each interval and mark under both conventions,
    /// every trap speed), so each printed ± has its coverage measured.</summary>
    public static IReadOnlyList<BenchFigure> All { get; } =
    [
        new("first motion", "ms", 1000),
        new("rollout mark", "ms", 1000),
        new("0-60 mph from standstill", "ms", 1000),
        new("0-60 mph after rollout", "ms", 1000),
        new("1/4 mile ET", "ms", 1000),
        new("1/4 mile ET after rollout", "ms", 1000),
        new("1/4 mile trap speed", "m/s", 1),
        new("30-50 mph", "ms", 1000),
        new("80-120 km/h", "ms", 1000),
        new("stopping distance", "m", 1),
        new("brake onset", "ms", 1000),
        new("rollout after first motion", "ms", 1000),
        new("speed at rollout", "m/s", 1),
        new("grade at staging", "%", 1),
        .. OtherStandardFigures(),
    ];

    private static IEnumerable<BenchFigure> OtherStandardFigures()
    {
        SpeedInterval[] named = [SpeedInterval.Mph(0, 60), SpeedInterval.Mph(30, 50), SpeedInterval.Kmh(80, 120)];
        foreach (SpeedInterval i in FigureRequest.Standard.SpeedIntervals.Where(i => !named.Any(n => n.FromMps == i.FromMps && n.ToMps == i.ToMps)))
        {
            yield return new(i.Label, "ms", 1000) { Interval = i };
            if (i.IsStanding)
            {
                yield return new($"{i.Label} after rollout", "ms", 1000) { Interval = i, Convention = FigureConvention.AfterRollout };
            }
        }

        double quarterMileM = 1320 * Units.MetresPerFoot;
        foreach (DistanceMark m in FigureRequest.Standard.DistanceMarks.Where(m => Math.Abs(m.DistanceM - quarterMileM) > 1e-6))
        {
            yield return new(m.Label, "ms", 1000) { Mark = m };
            yield return new($"{m.Label} after rollout", "ms", 1000) { Mark = m, Convention = FigureConvention.AfterRollout };
            if (m.TrapLengthM is not null)
            {
                yield return new($"{m.Label} trap speed", "m/s", 1) { Mark = m, Convention = FigureConvention.TrapSpeed };
            }
        }
    }
}

/// <summary>The values of every <see cref="BenchFigure"/> for one run, SI, null where absent.</summary>
public sealed class FigureValues
{
    /// <summary>The values.</summary>
    public double?[] Values { get; } = new double?[BenchFigure.All.Count];

    /// <summary>Their 1-σ.</summary>
    public double?[] Sigmas { get; } = new double?[BenchFigure.All.Count];

    /// <summary>Sets one figure.</summary>
    public FigureValues Set(int figure, double? value, double? sigma = null)
    {
        Values[figure] = value;
        Sigmas[figure] = sigma;
        return this;
    }
}
