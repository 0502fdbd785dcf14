namespace LaunchLogger.Simulation.Scenarios;

/// <summary>What the driver does: stand still (staged), launch at full throttle, accelerate to a
/// speed or a distance, coast briefly, brake to a stop (or not), and stand still again so the box
/// closes the run.</summary>
public sealed record RunPlan
{
    /// <summary>Time standing still before the launch, s.</summary>
    public double StageS { get; init; } = 3.0;

    /// <summary>True when the driver holds the brake pedal while staged (the brake switch then
    /// reads "on" until the launch).</summary>
    public bool HoldBrakeWhileStaged { get; init; } = true;

    /// <summary>When set, the driver holds the box's mark button from this long before the
    /// launch to this long after it, s (the box pauses its accelerometer onset while the button
    /// is down; a hold reaching the bench rest's 3 s arms a rest the first pulse drops); null
    /// for no press.</summary>
    public double? MarkHeldAroundLaunchS { get; init; }

    /// <summary>Stop accelerating at this speed, m/s; null for no speed target.</summary>
    public double? TargetSpeedMps { get; init; } = 29.0;

    /// <summary>Stop accelerating at this distance from the standstill position, m; null for no
    /// distance target. With both targets, the first one reached ends the acceleration.</summary>
    public double? TargetDistanceM { get; init; }

    /// <summary>Time off the throttle (clutch open) before braking, s.</summary>
    public double CoastS { get; init; } = 0.5;

    /// <summary>True to brake to a stop after coasting; false ends the simulation after coasting
    /// (the box then closes the run by shutdown, not by a stop).</summary>
    public bool BrakeToStop { get; init; } = true;

    /// <summary>Deceleration the driver asks of the brakes, in units of g0; more than the tyres can
    /// give brings in ABS.</summary>
    public double BrakeDemandG { get; init; } = 0.45;

    /// <summary>Time standing still after the stop, s (longer than the box's stop hold).</summary>
    public double StandStillAfterS { get; init; } = 3.0;

    /// <summary>The simulation ends here whatever happens, s.</summary>
    public double MaxDurationS { get; init; } = 180;
}
