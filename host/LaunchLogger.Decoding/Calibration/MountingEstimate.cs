namespace LaunchLogger.Decoding.Calibration;

/// <summary>How the accelerometer sits in the car, from one rest on level ground or from two
/// rests on one spot facing opposite ways, with the yaw from straight accelerations.</summary>
public sealed record MountingEstimate
{
    /// <summary>Mounting pitch, nose up positive, radians, the forward axis' offset included as an
    /// equivalent angle: what a level road reads as resting pitch.</summary>
    public required Estimate PitchRad { get; init; }

    /// <summary>Mounting roll, left side up positive, radians (reported, not saved).</summary>
    public required Estimate RollRad { get; init; }

    /// <summary>Mounting yaw, positive to the left, radians; null when no run had a firm,
    /// straight acceleration.</summary>
    public Estimate? YawRad { get; init; }

    /// <summary>True when two opposite rests separated the mounting from the ground's slope;
    /// false when the ground was taken as level, an assumption the data cannot check (each 1 % of
    /// slope along the car then adds 0.57° to <see cref="PitchRad"/>, beyond its σ).</summary>
    public required bool TwoWay { get; init; }

    /// <summary>The spot's slope along the car, radians, uphill positive in the direction the
    /// first rest faced; null unless <see cref="TwoWay"/>.</summary>
    public Estimate? GradeRad { get; init; }

    /// <summary>The spot's cross slope, radians, left side up positive for the first rest's
    /// heading; null unless <see cref="TwoWay"/>.</summary>
    public Estimate? CrossSlopeRad { get; init; }

    /// <summary>The rests used, the first rest first.</summary>
    public required IReadOnlyList<RestReading> Rests { get; init; }

    /// <summary>The accelerations the yaw came from.</summary>
    public IReadOnlyList<YawReading> Yaws { get; init; } = [];

    /// <summary>What the reader should know, one sentence each.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>Grade in percent (rise over run × 100); null unless <see cref="TwoWay"/>.</summary>
    public double? GradePercent => GradeRad is { } g ? Math.Tan(g.Value) * 100 : null;
}
