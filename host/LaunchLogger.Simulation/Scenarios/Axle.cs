namespace LaunchLogger.Simulation.Scenarios;

/// <summary>One of the car's two axles.</summary>
public enum Axle
{
    /// <summary>The front axle.</summary>
    Front,

    /// <summary>The rear axle.</summary>
    Rear,
}
