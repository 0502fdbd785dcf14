namespace LaunchLogger.Simulation.Scenarios;

/// <summary>A combustion engine with a clutch and a stepped gearbox.</summary>
/// <remarks>Launch: the engine is held at <see cref="LaunchRpm"/> (launch control) and the clutch's
/// torque capacity rises linearly from zero to <see cref="ClutchCapacityNm"/> over
/// <see cref="ClutchEngageS"/>; until the clutch locks, launch control cuts fuel above the launch
/// speed. Shifts happen at <see cref="ShiftRpm"/>: no drive for <see cref="ShiftTimeS"/>, then the
/// next gear with the clutch locked.</remarks>
public sealed record EngineSpec
{
    /// <summary>Full-throttle torque curve, ascending in rpm; linear between points.</summary>
    public IReadOnlyList<TorquePoint> TorqueCurve { get; init; } =
    [
        new(1000, 120), new(2000, 150), new(3000, 170), new(4000, 180), new(5000, 175), new(6000, 160), new(7000, 135),
    ];

    /// <summary>Idle speed; the engine never falls below it while the clutch slips, rpm.</summary>
    public double IdleRpm { get; init; } = 900;

    /// <summary>Speed held by launch control before and during the launch, rpm.</summary>
    public double LaunchRpm { get; init; } = 4000;

    /// <summary>Rev limiter: fuel is cut at or above this speed, rpm.</summary>
    public double RedlineRpm { get; init; } = 7000;

    /// <summary>Upshift point, rpm.</summary>
    public double ShiftRpm { get; init; } = 6600;

    /// <summary>Rotational inertia of the engine and flywheel, kg·m².</summary>
    public double InertiaKgM2 { get; init; } = 0.15;

    /// <summary>Gear ratios, first gear first.</summary>
    public IReadOnlyList<double> GearRatios { get; init; } = [3.4, 2.0, 1.35, 1.03, 0.83];

    /// <summary>Final drive ratio.</summary>
    public double FinalDrive { get; init; } = 4.1;

    /// <summary>Time without drive during an upshift, s.</summary>
    public double ShiftTimeS { get; init; } = 0.25;

    /// <summary>Torque the fully engaged clutch can pass before it slips, N·m.</summary>
    public double ClutchCapacityNm { get; init; } = 300;

    /// <summary>Time for the clutch's capacity to rise from zero to full at launch, s.</summary>
    public double ClutchEngageS { get; init; } = 0.3;

    /// <summary>Driven-wheel slip above which the driver (or a traction control) eases the clutch
    /// and throttle; null for a driver who does not (wheelspin).</summary>
    public double? TractionControlSlip { get; init; } = 0.15;
}
