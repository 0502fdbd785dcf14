namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The service brakes and a simple ABS.</summary>
/// <remarks>The pedal demand rises linearly over <see cref="RiseTimeS"/> to the plan's demanded
/// deceleration; each axle's brake torque is that demand × weight × its bias × the rolling radius.
/// ABS (per axle): when the wheel's slip goes below −<see cref="AbsReleaseSlip"/> the pressure is
/// dumped at <see cref="AbsDumpRatePerS"/>, above −<see cref="AbsReapplySlip"/> it is reapplied at
/// <see cref="AbsApplyRatePerS"/>, in between it is held. Below <see cref="AbsMinSpeedMps"/> ABS
/// stays out and the wheels may lock for the last few centimetres.</remarks>
public sealed record BrakeSpec
{
    /// <summary>Time for the pedal demand to rise from zero to full, s.</summary>
    public double RiseTimeS { get; init; } = 0.2;

    /// <summary>Share of the brake torque on the front axle (0–1).</summary>
    public double FrontBias { get; init; } = 0.68;

    /// <summary>True when the ABS works.</summary>
    public bool AbsEnabled { get; init; } = true;

    /// <summary>Braking slip (magnitude) above which ABS dumps pressure.</summary>
    public double AbsReleaseSlip { get; init; } = 0.16;

    /// <summary>Braking slip (magnitude) below which ABS builds pressure again.</summary>
    public double AbsReapplySlip { get; init; } = 0.07;

    /// <summary>Pressure dump rate, share of full pressure per second.</summary>
    public double AbsDumpRatePerS { get; init; } = 12;

    /// <summary>Pressure build rate, share of full pressure per second.</summary>
    public double AbsApplyRatePerS { get; init; } = 5;

    /// <summary>Speed below which ABS does not act, m/s.</summary>
    public double AbsMinSpeedMps { get; init; } = 1.5;
}
