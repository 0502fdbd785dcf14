namespace LaunchLogger.Simulation.Scenarios;

/// <summary>What turns the driven wheels.</summary>
public enum DrivetrainKind
{
    /// <summary>A combustion engine with a torque curve, a clutch and a gearbox.</summary>
    Engine,

    /// <summary>An electric motor: constant torque up to its base speed, then constant power.</summary>
    Electric,
}
