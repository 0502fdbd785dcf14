using System.Text.Json.Serialization;

namespace LaunchLogger.Simulation.Truth;

/// <summary>The true moments of a simulated run. Times are seconds on the box's clock (the same
/// axis as the log's microseconds ÷ 10⁶); distances from the standstill position.</summary>
public sealed record TruthEvents
{
    /// <summary>The driver launched (clutch or torque starts to come in), s.</summary>
    public double? LaunchS { get; init; }

    /// <summary>The car first moved, s.</summary>
    public double? FirstMotionS { get; init; }

    /// <summary>The car had covered the rollout distance, s; null when it never did.</summary>
    public double? RolloutS { get; init; }

    /// <summary>Speed at the rollout mark, m/s.</summary>
    public double? RolloutSpeedMps { get; init; }

    /// <summary>The rollout distance these refer to, m.</summary>
    public double RolloutDistanceM { get; init; }

    /// <summary>The acceleration target (speed or distance) was reached, s.</summary>
    public double? TargetReachedS { get; init; }

    /// <summary>Upshifts began at these times, s.</summary>
    public IReadOnlyList<double> ShiftStartsS { get; init; } = [];

    /// <summary>The brake pedal started to move (start of brake application), s.</summary>
    public double? BrakeOnsetS { get; init; }

    /// <summary>Speed at brake onset, m/s.</summary>
    public double? BrakeOnsetSpeedMps { get; init; }

    /// <summary>Distance at brake onset, m.</summary>
    public double? BrakeOnsetDistanceM { get; init; }

    /// <summary>The brake switch closed for the stop (pedal onset plus the switch's delay), s;
    /// null without a switch.</summary>
    public double? BrakeSwitchOnS { get; init; }

    /// <summary>Times ABS dumped pressure during the stop.</summary>
    public int AbsCycles { get; init; }

    /// <summary>The car came to rest after braking, s.</summary>
    public double? StandstillS { get; init; }

    /// <summary>Distance at rest, m.</summary>
    public double? StandstillDistanceM { get; init; }

    /// <summary>Highest speed, m/s.</summary>
    public double PeakSpeedMps { get; init; }

    /// <summary>Highest longitudinal acceleration, m/s².</summary>
    public double PeakAccelMps2 { get; init; }

    /// <summary>Highest driven-wheel slip ratio while accelerating.</summary>
    public double PeakDrivenSlip { get; init; }

    /// <summary>Time while accelerating that the pickup's own wheel slipped past the tyre's
    /// friction peak (<c>TyreSpec.PeakSlip</c>): the wheel ran off on its own, s. Kept out of the
    /// truth file, whose fields are fixed.</summary>
    [JsonIgnore]
    public double PickupSpinS { get; init; }

    /// <summary>Road grade, percent (positive uphill).</summary>
    public double GradePercent { get; init; }

    /// <summary>Head wind, m/s (negative: tail wind).</summary>
    public double HeadwindMps { get; init; }

    /// <summary>Stopping distance from brake onset to rest, m (SAE J299 definition).</summary>
    public double? StoppingDistanceM => StandstillDistanceM - BrakeOnsetDistanceM;
}
