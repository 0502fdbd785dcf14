namespace LaunchLogger.Simulation.Scenarios;

/// <summary>A wheel-speed pickup: a toothed ring (or the ABS tone ring) on one wheel of an axle,
/// read by a Hall-effect or variable-reluctance sensor.</summary>
/// <remarks>On a driven wheel the pulses follow the wheel, so wheelspin makes the car seem to go
/// further than it does; on an undriven wheel braking slip makes it seem to go less far.</remarks>
public sealed record PulsePickupSpec
{
    /// <summary>The axle of the wheel carrying the pickup.</summary>
    public Axle Axle { get; init; } = Axle.Rear;

    /// <summary>Teeth on the ring.</summary>
    public int Teeth { get; init; } = 48;

    /// <summary>Edges counted per tooth: 1 (rising) or 2 (rising and falling).</summary>
    public int EdgesPerTooth { get; init; } = 1;

    /// <summary>1-σ error of each edge's position around the ring, as a fraction of the tooth pitch
    /// (machining and sensor threshold variation). Drawn once per run; repeats every revolution.</summary>
    public double ToothSpacingErrorFraction { get; init; } = 0.01;

    /// <summary>Tooth width as a fraction of the pitch, where the falling edge sits (0–1).</summary>
    public double DutyCycle { get; init; } = 0.5;
}
