namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The brake-light switch wired to the box's input.</summary>
public sealed record BrakeSwitchSpec
{
    /// <summary>True when the switch is wired.</summary>
    public bool Present { get; init; }

    /// <summary>Delay from pedal movement to the switch closing (or opening), s.</summary>
    public double DelayS { get; init; } = 0.015;
}
