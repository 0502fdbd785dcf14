namespace LaunchLogger.Cli.Bench;

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

    /// <summary>Every figure, indexed by the constants above.</summary>
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
    ];
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
