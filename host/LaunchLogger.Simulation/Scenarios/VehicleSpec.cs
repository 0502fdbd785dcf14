namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The car's body: mass and where it sits, aerodynamics, rolling resistance, inertia of
/// the wheels and the suspension's resistance to pitch.</summary>
public sealed record VehicleSpec
{
    /// <summary>Mass with driver, kg.</summary>
    public double MassKg { get; init; } = 1200;

    /// <summary>Distance between the axles, m.</summary>
    public double WheelbaseM { get; init; } = 2.55;

    /// <summary>Height of the centre of gravity above the road, m.</summary>
    public double CgHeightM { get; init; } = 0.52;

    /// <summary>Share of the weight on the front axle at rest on level ground (0–1).</summary>
    public double FrontWeightFraction { get; init; } = 0.6;

    /// <summary>Which axle the drivetrain turns.</summary>
    public DrivenAxle DrivenAxle { get; init; } = DrivenAxle.Front;

    /// <summary>Share of the drive torque sent to the front axle when both are driven (0–1).</summary>
    public double FrontTorqueFraction { get; init; } = 0.5;

    /// <summary>Drag coefficient times frontal area (CdA), m².</summary>
    public double DragAreaM2 { get; init; } = 0.66;

    /// <summary>Rolling resistance force per unit of normal load.</summary>
    public double RollingResistanceCoefficient { get; init; } = 0.012;

    /// <summary>Rotational inertia of one axle's two wheels with hubs and discs, kg·m².</summary>
    public double AxleInertiaKgM2 { get; init; } = 1.6;

    /// <summary>Pitch stiffness of the suspension: moment per radian of pitch, N·m/rad.</summary>
    public double PitchStiffnessNmPerRad { get; init; } = 160_000;

    /// <summary>Natural frequency of the body's pitch motion, Hz (sets the pitch inertia).</summary>
    public double PitchFrequencyHz { get; init; } = 1.6;

    /// <summary>Damping ratio of the pitch motion (1 = critically damped).</summary>
    public double PitchDampingRatio { get; init; } = 0.35;
}
