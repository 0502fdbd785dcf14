namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The drivetrain: which kind, and its efficiency from crank or motor to the wheels.</summary>
public sealed record DrivetrainSpec
{
    /// <summary>Engine or electric motor; the other part's settings are ignored.</summary>
    public DrivetrainKind Kind { get; init; } = DrivetrainKind.Engine;

    /// <summary>Share of the torque that reaches the wheels (0–1).</summary>
    public double Efficiency { get; init; } = 0.9;

    /// <summary>The engine, gearbox and clutch (used when <see cref="Kind"/> is Engine).</summary>
    public EngineSpec Engine { get; init; } = new();

    /// <summary>The motor (used when <see cref="Kind"/> is Electric).</summary>
    public MotorSpec Motor { get; init; } = new();
}
