using System.Diagnostics.CodeAnalysis;

namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The scenarios that ship with the simulator: invented cars of our own club, each
/// showing a different side of the box. Every one stands still, launches, and ends standing still.</summary>
public static class BuiltInScenarios
{
    /// <summary>The scenario the demo runs: <c>roadster-launch</c>.</summary>
    public const string DefaultName = "roadster-launch";

    private static readonly Scenario[] All =
    [
        RoadsterLaunch(),
        ClubHatch(),
        CoupeWheelspin(),
        ElectricSaloon(),
        BrakeTest60(),
    ];

    /// <summary>Names of the built-in scenarios, the default first.</summary>
    public static IReadOnlyList<string> Names { get; } = All.Select(s => s.Name).ToArray();

    /// <summary>The default scenario (<see cref="DefaultName"/>).</summary>
    public static Scenario Default => Get(DefaultName);

    /// <summary>Every built-in scenario, the default first.</summary>
    public static IReadOnlyList<Scenario> Scenarios => All;

    /// <summary>The built-in scenario <paramref name="name"/> (case-insensitive).</summary>
    /// <exception cref="KeyNotFoundException">No built-in scenario has that name; the message lists them.</exception>
    public static Scenario Get(string name)
    {
        if (TryGet(name, out Scenario? scenario))
        {
            return scenario;
        }

        throw new KeyNotFoundException($"unknown scenario '{name}' (built-in: {string.Join(", ", Names)})");
    }

    /// <summary>Finds a built-in scenario by name (case-insensitive).</summary>
    public static bool TryGet(string name, [NotNullWhen(true)] out Scenario? scenario)
    {
        scenario = All.FirstOrDefault(s => string.Equals(s.Name, name, StringComparison.OrdinalIgnoreCase));
        return scenario != null;
    }

    /// <summary>The capture loop of an ESP32 under nanoFramework polling its hardware pulse
    /// counter: a step about every millisecond (1,000 interpreted IL instructions at 0.4–1.5 µs
    /// each), ±0.25 ms from step to step, and about once a second a stall of 20 ms while a frame
    /// is written. An estimate, not a measurement: see hardware-notes/loop-timing.md.</summary>
    private static CaptureSpec EspPolledLoop() => new()
    {
        Kind = CaptureKind.PolledCounter, LoopPeriodMicros = 1000, LoopJitterMicros = 250, PausesPerSecond = 1, PauseMicros = 20_000,
    };

    /// <summary>A light rear-drive roadster over a quarter mile, then a firm stop: a 48-tooth
    /// pickup on an undriven front wheel polled by an ESP32-style loop (1 ms, with stalls), a
    /// slightly tilted accelerometer, and the brake switch wired.</summary>
    private static Scenario RoadsterLaunch() => new()
    {
        Name = "roadster-launch",
        Description = "rear-drive roadster, quarter mile then a firm stop; 48-tooth pickup on a front wheel, polled counter, brake switch",
        Vehicle = new VehicleSpec
        {
            MassKg = 1235, WheelbaseM = 2.46, CgHeightM = 0.47, FrontWeightFraction = 0.48, DrivenAxle = DrivenAxle.Rear,
            DragAreaM2 = 0.61, RollingResistanceCoefficient = 0.011, AxleInertiaKgM2 = 1.6,
            PitchStiffnessNmPerRad = 150_000, PitchFrequencyHz = 1.7, PitchDampingRatio = 0.35,
        },
        Tyre = new TyreSpec { RollingRadiusM = 0.3, RadiusGrowthAt30Mps = 0.004, PeakFriction = 1.05, PeakSlip = 0.1, SlidingFrictionFraction = 0.8 },
        Drivetrain = new DrivetrainSpec
        {
            Kind = DrivetrainKind.Engine,
            Efficiency = 0.9,
            Engine = new EngineSpec
            {
                TorqueCurve = [new(1000, 165), new(2000, 215), new(3000, 250), new(4200, 262), new(5200, 250), new(6000, 228), new(6700, 200)],
                IdleRpm = 850, LaunchRpm = 3800, RedlineRpm = 6600, ShiftRpm = 6350, InertiaKgM2 = 0.16,
                GearRatios = [3.42, 2.53, 1.86, 1.42, 1.13, 0.92], FinalDrive = 3.36,
                ShiftTimeS = 0.24, ClutchCapacityNm = 400, ClutchEngageS = 0.25,
            },
        },
        Brakes = new BrakeSpec { RiseTimeS = 0.2, FrontBias = 0.66 },
        Environment = new EnvironmentSpec { GradePercent = 0, HeadwindMps = 0.8, AirDensityKgM3 = 1.19 },
        Plan = new RunPlan { StageS = 3.0, TargetSpeedMps = null, TargetDistanceM = 402.336, CoastS = 1.0, BrakeToStop = true, BrakeDemandG = 0.6, StandStillAfterS = 3.0 },
        Pickup = new PulsePickupSpec { Axle = Axle.Front, Teeth = 48, EdgesPerTooth = 1, ToothSpacingErrorFraction = 0.01 },
        Capture = EspPolledLoop(),
        Accelerometer = new AccelerometerSpec
        {
            OutputDataRateHz = 800, ClockDriftPpm = 1500, FifoDepth = 32, ReadIntervalMicros = 10_000,
            NoiseDensityMicroGPerRootHz = 150, VibrationMilliGRms = 3,
            BiasMilliG = new(12, -8, 20), ScaleError = new(0.005, -0.004, 0.008),
            MountPitchDeg = 1.5, MountRollDeg = -0.8, MountYawDeg = 2.0, FullScaleG = 8,
        },
        BrakeSwitch = new BrakeSwitchSpec { Present = true, DelayS = 0.015 },
        Box = new BoxSpec { ClockStartMicros = 7_000_000 },
    };

    /// <summary>A front-drive hatch on a coarse 12-tooth pickup (an undriven rear wheel) polled
    /// ESP32-style, a slight uphill and head wind, to 65 mph and a gentle stop.</summary>
    private static Scenario ClubHatch() => new()
    {
        Name = "club-hatch",
        Description = "front-drive hatch to 65 mph, gentle stop; coarse 12-tooth pickup on a rear wheel, polled counter, 0.5 % uphill",
        Vehicle = new VehicleSpec
        {
            MassKg = 1150, WheelbaseM = 2.5, CgHeightM = 0.53, FrontWeightFraction = 0.62, DrivenAxle = DrivenAxle.Front,
            DragAreaM2 = 0.68, RollingResistanceCoefficient = 0.012, AxleInertiaKgM2 = 1.4,
        },
        Tyre = new TyreSpec { RollingRadiusM = 0.29, RadiusGrowthAt30Mps = 0.003, PeakFriction = 1.0 },
        Drivetrain = new DrivetrainSpec
        {
            Kind = DrivetrainKind.Engine,
            Efficiency = 0.9,
            Engine = new EngineSpec
            {
                TorqueCurve = [new(1000, 110), new(2000, 135), new(3000, 150), new(4000, 160), new(5000, 155), new(6000, 142), new(7000, 120)],
                IdleRpm = 850, LaunchRpm = 3500, RedlineRpm = 6800, ShiftRpm = 6500, InertiaKgM2 = 0.12,
                GearRatios = [3.45, 1.95, 1.3, 1.03, 0.84], FinalDrive = 4.06,
                ShiftTimeS = 0.3, ClutchCapacityNm = 260, ClutchEngageS = 0.35,
            },
        },
        Environment = new EnvironmentSpec { GradePercent = 0.5, HeadwindMps = 1.5, AirDensityKgM3 = 1.21 },
        Plan = new RunPlan { StageS = 3.0, TargetSpeedMps = 29.06, CoastS = 0.5, BrakeToStop = true, BrakeDemandG = 0.45, StandStillAfterS = 3.0 },
        Pickup = new PulsePickupSpec { Axle = Axle.Rear, Teeth = 12, EdgesPerTooth = 1, ToothSpacingErrorFraction = 0.015 },
        Capture = EspPolledLoop(),
        Accelerometer = new AccelerometerSpec
        {
            OutputDataRateHz = 400, ClockDriftPpm = -2500, FifoDepth = 32, ReadIntervalMicros = 20_000,
            NoiseDensityMicroGPerRootHz = 220, VibrationMilliGRms = 4,
            BiasMilliG = new(-15, 6, -25), ScaleError = new(-0.01, 0.006, 0.004),
            MountPitchDeg = -2.0, MountRollDeg = 1.0, MountYawDeg = -1.0, FullScaleG = 4,
        },
        Box = new BoxSpec { ClockStartMicros = 42_000_000 },
    };

    /// <summary>A powerful rear-drive coupe on a cool surface: the tyres spin at launch, and the
    /// pickup sits on a driven rear wheel (a second one on a front wheel shows the difference);
    /// exact edge timestamps as on a Linux board.</summary>
    private static Scenario CoupeWheelspin() => new()
    {
        Name = "coupe-wheelspin",
        Description = "rear-drive coupe with wheelspin at launch, to 80 mph; pickup on a driven rear wheel (second on a front wheel), exact edges",
        Vehicle = new VehicleSpec
        {
            MassKg = 1480, WheelbaseM = 2.7, CgHeightM = 0.5, FrontWeightFraction = 0.53, DrivenAxle = DrivenAxle.Rear,
            DragAreaM2 = 0.62, RollingResistanceCoefficient = 0.011, AxleInertiaKgM2 = 1.9,
            PitchStiffnessNmPerRad = 190_000, PitchFrequencyHz = 1.5, PitchDampingRatio = 0.3,
        },
        Tyre = new TyreSpec { RollingRadiusM = 0.33, RadiusGrowthAt30Mps = 0.005, PeakFriction = 0.9, PeakSlip = 0.12, SlidingFrictionFraction = 0.75 },
        Drivetrain = new DrivetrainSpec
        {
            Kind = DrivetrainKind.Engine,
            Efficiency = 0.88,
            Engine = new EngineSpec
            {
                TorqueCurve = [new(1000, 250), new(1800, 420), new(2500, 450), new(4500, 450), new(5500, 420), new(6500, 370), new(7200, 330)],
                IdleRpm = 800, LaunchRpm = 3200, RedlineRpm = 7000, ShiftRpm = 6700, InertiaKgM2 = 0.2,
                GearRatios = [3.6, 2.2, 1.55, 1.2, 1.0, 0.82], FinalDrive = 3.15,
                ShiftTimeS = 0.2, ClutchCapacityNm = 600, ClutchEngageS = 0.15, TractionControlSlip = 0.45,
            },
        },
        Environment = new EnvironmentSpec { GradePercent = 0, HeadwindMps = -1.0, AirDensityKgM3 = 1.24 },
        Plan = new RunPlan { StageS = 3.0, TargetSpeedMps = 35.8, CoastS = 0.5, BrakeToStop = true, BrakeDemandG = 0.5, StandStillAfterS = 3.0 },
        Pickup = new PulsePickupSpec { Axle = Axle.Rear, Teeth = 48, EdgesPerTooth = 1, ToothSpacingErrorFraction = 0.01 },
        SecondPickup = new PulsePickupSpec { Axle = Axle.Front, Teeth = 48, EdgesPerTooth = 1, ToothSpacingErrorFraction = 0.01 },
        Capture = new CaptureSpec { Kind = CaptureKind.ExactEdges, LoopPeriodMicros = 1000, LoopJitterMicros = 150, EdgeLatencyMicros = 15, EdgeJitterMicros = 5, QueueCapacity = 1024 },
        Accelerometer = new AccelerometerSpec
        {
            OutputDataRateHz = 1000, ClockDriftPpm = 800, FifoDepth = 32, ReadIntervalMicros = 10_000,
            NoiseDensityMicroGPerRootHz = 150, VibrationMilliGRms = 5,
            BiasMilliG = new(8, 14, -12), ScaleError = new(0.004, 0.002, -0.006),
            MountPitchDeg = 0.5, MountRollDeg = 0.3, MountYawDeg = -3.0, FullScaleG = 8,
        },
        Box = new BoxSpec { ClockStartMicros = 120_000_000 },
    };

    /// <summary>A heavy all-wheel-drive electric saloon with traction control: a fine 100-tooth
    /// pickup on a front wheel with exact edge timestamps, a fast accelerometer, to 100 mph.</summary>
    private static Scenario ElectricSaloon() => new()
    {
        Name = "electric-saloon",
        Description = "all-wheel-drive electric saloon to 100 mph; fine 100-tooth pickup on a front wheel, exact edges, 1.6 kHz accelerometer",
        Vehicle = new VehicleSpec
        {
            MassKg = 2150, WheelbaseM = 2.95, CgHeightM = 0.48, FrontWeightFraction = 0.49, DrivenAxle = DrivenAxle.All,
            FrontTorqueFraction = 0.4, DragAreaM2 = 0.55, RollingResistanceCoefficient = 0.01, AxleInertiaKgM2 = 2.2,
            PitchStiffnessNmPerRad = 260_000, PitchFrequencyHz = 1.4, PitchDampingRatio = 0.4,
        },
        Tyre = new TyreSpec { RollingRadiusM = 0.34, RadiusGrowthAt30Mps = 0.004, PeakFriction = 1.05 },
        Drivetrain = new DrivetrainSpec
        {
            Kind = DrivetrainKind.Electric,
            Efficiency = 0.92,
            Motor = new MotorSpec { MaxTorqueNm = 520, MaxPowerW = 310_000, MaxRpm = 16_000, GearRatio = 9.0, InertiaKgM2 = 0.06, TorqueRampS = 0.1, TractionControlSlip = 0.1 },
        },
        Environment = new EnvironmentSpec { GradePercent = -0.3, HeadwindMps = 0, AirDensityKgM3 = 1.2 },
        Plan = new RunPlan { StageS = 3.0, TargetSpeedMps = 44.704, CoastS = 0.5, BrakeToStop = true, BrakeDemandG = 0.5, StandStillAfterS = 3.0 },
        Pickup = new PulsePickupSpec { Axle = Axle.Front, Teeth = 100, EdgesPerTooth = 1, ToothSpacingErrorFraction = 0.005 },
        Capture = new CaptureSpec { Kind = CaptureKind.ExactEdges, LoopPeriodMicros = 1000, LoopJitterMicros = 100, EdgeLatencyMicros = 10, EdgeJitterMicros = 3, QueueCapacity = 2048 },
        Accelerometer = new AccelerometerSpec
        {
            OutputDataRateHz = 1600, ClockDriftPpm = -600, FifoDepth = 64, ReadIntervalMicros = 10_000,
            NoiseDensityMicroGPerRootHz = 120, VibrationMilliGRms = 1.5,
            BiasMilliG = new(-5, 10, 15), ScaleError = new(0.003, -0.002, 0.004),
            MountPitchDeg = 0.8, MountRollDeg = 0, MountYawDeg = 0.5, FullScaleG = 8,
        },
        Box = new BoxSpec { ClockStartMicros = 4_280_000_000 },
    };

    /// <summary>A front-drive estate to above 60 mph, then the hardest stop the tyres allow, with
    /// ABS working and the brake switch wired; 48-tooth pickup on an undriven rear wheel.</summary>
    private static Scenario BrakeTest60() => new()
    {
        Name = "brake-test-60",
        Description = "front-drive estate to 65 mph, then a full ABS stop; brake switch, 48-tooth pickup on a rear wheel, polled counter",
        Vehicle = new VehicleSpec
        {
            MassKg = 1450, WheelbaseM = 2.7, CgHeightM = 0.55, FrontWeightFraction = 0.6, DrivenAxle = DrivenAxle.Front,
            DragAreaM2 = 0.7, RollingResistanceCoefficient = 0.012, AxleInertiaKgM2 = 1.7,
            PitchStiffnessNmPerRad = 170_000, PitchFrequencyHz = 1.5, PitchDampingRatio = 0.35,
        },
        Tyre = new TyreSpec { RollingRadiusM = 0.32, RadiusGrowthAt30Mps = 0.003, PeakFriction = 1.0, PeakSlip = 0.1, SlidingFrictionFraction = 0.8 },
        Drivetrain = new DrivetrainSpec
        {
            Kind = DrivetrainKind.Engine,
            Efficiency = 0.9,
            Engine = new EngineSpec
            {
                TorqueCurve = [new(1000, 180), new(1750, 320), new(3000, 320), new(4000, 280), new(4800, 230)],
                IdleRpm = 800, LaunchRpm = 2500, RedlineRpm = 4800, ShiftRpm = 4500, InertiaKgM2 = 0.2,
                GearRatios = [3.8, 2.1, 1.3, 0.95, 0.76, 0.62], FinalDrive = 3.6,
                ShiftTimeS = 0.35, ClutchCapacityNm = 450, ClutchEngageS = 0.4,
            },
        },
        Brakes = new BrakeSpec { RiseTimeS = 0.15, FrontBias = 0.7, AbsEnabled = true },
        Environment = new EnvironmentSpec { GradePercent = 0, HeadwindMps = 0, AirDensityKgM3 = 1.2 },
        Plan = new RunPlan { StageS = 3.0, TargetSpeedMps = 29.06, CoastS = 1.0, BrakeToStop = true, BrakeDemandG = 1.2, StandStillAfterS = 3.0 },
        Pickup = new PulsePickupSpec { Axle = Axle.Rear, Teeth = 48, EdgesPerTooth = 1, ToothSpacingErrorFraction = 0.01 },
        Capture = EspPolledLoop(),
        Accelerometer = new AccelerometerSpec
        {
            OutputDataRateHz = 800, ClockDriftPpm = 2000, FifoDepth = 32, ReadIntervalMicros = 10_000,
            NoiseDensityMicroGPerRootHz = 150, VibrationMilliGRms = 3,
            BiasMilliG = new(10, 5, -18), ScaleError = new(0.006, 0.001, -0.003),
            MountPitchDeg = 1.0, MountRollDeg = 0.5, MountYawDeg = 1.0, FullScaleG = 8,
        },
        BrakeSwitch = new BrakeSwitchSpec { Present = true, DelayS = 0.02 },
        Box = new BoxSpec { ClockStartMicros = 15_500_000 },
    };
}
