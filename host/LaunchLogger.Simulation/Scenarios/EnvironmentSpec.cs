namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The road and the air.</summary>
public sealed record EnvironmentSpec
{
    /// <summary>Road grade, rise over run in percent; positive uphill.</summary>
    public double GradePercent { get; init; }

    /// <summary>Wind along the road, m/s; positive is a head wind, negative a tail wind.</summary>
    public double HeadwindMps { get; init; }

    /// <summary>Air density, kg/m³ (ISA sea level: 1.225).</summary>
    public double AirDensityKgM3 { get; init; } = 1.2;
}
