namespace LaunchLogger.Simulation.Scenarios;

/// <summary>Which wheels the drivetrain turns.</summary>
public enum DrivenAxle
{
    /// <summary>Front-wheel drive.</summary>
    Front,

    /// <summary>Rear-wheel drive.</summary>
    Rear,

    /// <summary>Both axles, with a fixed torque split.</summary>
    All,
}
