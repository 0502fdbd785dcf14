namespace LaunchLogger.Simulation.Scenarios;

/// <summary>An electric motor with a single reduction gear: constant torque up to the speed where
/// torque × speed reaches the power limit, constant power above it.</summary>
public sealed record MotorSpec
{
    /// <summary>Torque limit at the motor shaft, N·m.</summary>
    public double MaxTorqueNm { get; init; } = 400;

    /// <summary>Power limit, W.</summary>
    public double MaxPowerW { get; init; } = 200_000;

    /// <summary>Highest motor speed; no drive at or above it, rpm.</summary>
    public double MaxRpm { get; init; } = 16_000;

    /// <summary>Reduction from motor to wheels (including the final drive).</summary>
    public double GearRatio { get; init; } = 9.0;

    /// <summary>Rotational inertia of the rotor, kg·m².</summary>
    public double InertiaKgM2 { get; init; } = 0.05;

    /// <summary>Time for the torque to rise from zero to full at launch, s (0 = a step).</summary>
    public double TorqueRampS { get; init; } = 0.15;

    /// <summary>Slip ratio above which traction control trims the torque; null for none.</summary>
    public double? TractionControlSlip { get; init; } = 0.12;
}
