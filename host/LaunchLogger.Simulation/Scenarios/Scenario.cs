namespace LaunchLogger.Simulation.Scenarios;

/// <summary>Everything the simulator needs for one run: the car, the road, what the driver does,
/// the sensors and the box. Immutable; vary it with <c>with</c> expressions or
/// <see cref="ScenarioFile.Apply"/>.</summary>
/// <remarks>SI units throughout unless the property name says otherwise. The JSON form (snake_case
/// names) is documented in SCENARIO-FORMAT.md next to this project.</remarks>
public sealed record Scenario
{
    /// <summary>Short name, e.g. "club-hatch".</summary>
    public string Name { get; init; } = "custom";

    /// <summary>One line saying what the scenario shows.</summary>
    public string Description { get; init; } = "";

    /// <summary>Body, mass distribution, aerodynamics and suspension pitch.</summary>
    public VehicleSpec Vehicle { get; init; } = new();

    /// <summary>Tyres: rolling radius and the slip curve.</summary>
    public TyreSpec Tyre { get; init; } = new();

    /// <summary>Engine with gears and clutch, or electric motor.</summary>
    public DrivetrainSpec Drivetrain { get; init; } = new();

    /// <summary>Service brakes and ABS.</summary>
    public BrakeSpec Brakes { get; init; } = new();

    /// <summary>Road grade, wind and air.</summary>
    public EnvironmentSpec Environment { get; init; } = new();

    /// <summary>What the driver does, phase by phase.</summary>
    public RunPlan Plan { get; init; } = new();

    /// <summary>The wheel-speed pickup on the distance channel (channel 0).</summary>
    public PulsePickupSpec Pickup { get; init; } = new();

    /// <summary>An optional second pickup (channel 1), e.g. on a driven wheel; null for none.</summary>
    public PulsePickupSpec? SecondPickup { get; init; }

    /// <summary>How the box captures pulse edges: exact timestamps or a polled counter.</summary>
    public CaptureSpec Capture { get; init; } = new();

    /// <summary>The accelerometer and how it is mounted.</summary>
    public AccelerometerSpec Accelerometer { get; init; } = new();

    /// <summary>The optional brake-light switch input.</summary>
    public BrakeSwitchSpec BrakeSwitch { get; init; } = new();

    /// <summary>The box's clock and the settings it is configured with.</summary>
    public BoxSpec Box { get; init; } = new();

    /// <summary>Checks every parameter.</summary>
    /// <returns>Null when the scenario is usable; otherwise one line naming the field (by its
    /// JSON path, e.g. <c>vehicle.mass_kg</c>), the rule and the value.</returns>
    public string? Validate() => ScenarioValidator.Validate(this);
}
