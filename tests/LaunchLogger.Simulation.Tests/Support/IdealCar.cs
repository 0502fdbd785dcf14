using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Tests.Support;

/// <summary>A car stripped to the textbook: a point mass pushed by a constant force (or constant
/// power), no drag, no rolling resistance, practically no wheel inertia, tyres that barely slip.
/// Its motion must match the closed-form kinematics.</summary>
internal static class IdealCar
{
    internal const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)
    internal const double MassKg = 1000;
    internal const double RadiusM = 0.3;
    internal const double AxleInertiaKgM2 = 1e-4;

    /// <summary>Drive force <paramref name="forceN"/> at the wheels, capped at
    /// <paramref name="powerW"/> of power.</summary>
    internal static Scenario Create(double forceN, double powerW = 1e9, double massKg = MassKg, double targetSpeedMps = 30) => new()
    {
        Name = "ideal",
        Vehicle = new VehicleSpec
        {
            MassKg = massKg, DrivenAxle = DrivenAxle.Rear, DragAreaM2 = 0, RollingResistanceCoefficient = 0,
            AxleInertiaKgM2 = AxleInertiaKgM2,
        },
        Tyre = new TyreSpec { RollingRadiusM = RadiusM, RadiusGrowthAt30Mps = 0, PeakFriction = 3, PeakSlip = 0.01, SlidingFrictionFraction = 0.9 },
        Drivetrain = new DrivetrainSpec
        {
            Kind = DrivetrainKind.Electric,
            Efficiency = 1,
            Motor = new MotorSpec { MaxTorqueNm = forceN * RadiusM, MaxPowerW = powerW, MaxRpm = 99_000, GearRatio = 1, InertiaKgM2 = 0, TorqueRampS = 0, TractionControlSlip = null },
        },
        Brakes = new BrakeSpec { RiseTimeS = 0, AbsEnabled = false },
        Environment = new EnvironmentSpec { GradePercent = 0, HeadwindMps = 0, AirDensityKgM3 = 0 },
        Plan = new RunPlan { StageS = 2, TargetSpeedMps = targetSpeedMps, CoastS = 0, BrakeToStop = false, StandStillAfterS = 3 },
        Pickup = new PulsePickupSpec { Axle = Axle.Front, Teeth = 48, ToothSpacingErrorFraction = 0 },
        Capture = new CaptureSpec { Kind = CaptureKind.ExactEdges, LoopPeriodMicros = 1000, LoopJitterMicros = 0, EdgeLatencyMicros = 0, EdgeJitterMicros = 0 },
        Accelerometer = new AccelerometerSpec
        {
            OutputDataRateHz = 1000, ClockDriftPpm = 0, NoiseDensityMicroGPerRootHz = 0, VibrationMilliGRms = 0,
            BiasMilliG = AxisTriple.Zero, ScaleError = AxisTriple.Zero, MountPitchDeg = 0, MountRollDeg = 0, MountYawDeg = 0,
        },
    };

    /// <summary>The effective mass: the body plus the wheels' inertia seen at the road (J/r² per axle).</summary>
    internal static double EffectiveMassKg(double massKg = MassKg) => massKg + (2 * AxleInertiaKgM2 / (RadiusM * RadiusM));
}
