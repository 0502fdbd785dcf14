namespace LaunchLogger.Simulation.Scenarios;

/// <summary>One value per sensor axis, in the unit the property holding it names.</summary>
/// <param name="X">Sensor x axis.</param>
/// <param name="Y">Sensor y axis.</param>
/// <param name="Z">Sensor z axis.</param>
public sealed record AxisTriple(double X, double Y, double Z)
{
    /// <summary>All three zero.</summary>
    public static AxisTriple Zero { get; } = new(0, 0, 0);
}
