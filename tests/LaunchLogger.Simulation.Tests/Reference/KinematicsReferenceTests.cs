using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Tests.Support;

namespace LaunchLogger.Simulation.Tests.Reference;

/// <summary>The vehicle model against closed-form mechanics, through the whole simulator.</summary>
public sealed class KinematicsReferenceTests
{
    [Theory]
    [InlineData(1.0)]
    [InlineData(3.0)]
    [InlineData(6.0)]
    public void Constant_force_gives_constant_acceleration(double secondsAfterMotion)
    {
        double a = 4.0;
        double force = a * IdealCar.EffectiveMassKg();
        SimulationResult r = Simulator.Run(IdealCar.Create(force), seed: 1);
        double t0 = r.Events.FirstMotionS!.Value;

        // Kinematics, any textbook: from rest at constant a, d = a·t²/2 and v = a·t.
        double t = secondsAfterMotion;
        Assert.Equal(0.5 * a * t * t, TrajectoryAt.Distance(r.Truth, t0 + t), 1e-3);
        Assert.Equal(a * t, TrajectoryAt.Speed(r.Truth, t0 + t), 1e-3);
    }

    [Fact]
    public void Half_g_launch_matches_the_reference_rollout_and_zero_to_sixty()
    {
        double a = 0.5 * IdealCar.G0;
        SimulationResult r = Simulator.Run(IdealCar.Create(a * IdealCar.EffectiveMassKg()), seed: 3);
        double t0 = r.Events.FirstMotionS!.Value;

        // REFERENCES.md (kinematics): at a constant 0.5 g from rest, 1 ft takes 0.35260 s; 0–60 mph
        // takes 5.4702 s from standstill and 5.1177 s once the first foot is subtracted.
        Assert.Equal(0.35260, r.Events.RolloutS!.Value - t0, 1e-4);
        FigureSet figures = FigureCalculator.Compute(r.Truth, new Estimate(t0, 0));
        IntervalFigure zeroTo60 = figures.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph");
        Assert.Equal(5.4702, zeroTo60.FromStandstillS!.Value, 1e-3);
        Assert.Equal(5.1177, zeroTo60.FromRolloutS!.Value, 1e-3);

        // The simulator's own truth figures come from the same calculator.
        Assert.Equal(zeroTo60.FromStandstillS!.Value, r.Figures!.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS!.Value, 1e-9);
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(0.8)]
    public void Constant_deceleration_stops_in_v_squared_over_2a(double demandG)
    {
        Scenario s = IdealCar.Create(3 * IdealCar.EffectiveMassKg(), targetSpeedMps: 25);
        s = s with { Plan = s.Plan with { BrakeToStop = true, BrakeDemandG = demandG, CoastS = 0.5 } };
        SimulationResult r = Simulator.Run(s, seed: 2);

        // The brakes' torque is demand × m × g0 × r in total; against the effective mass it
        // decelerates the car at a = demand·g0·m / m_eff. Kinematics, any textbook: d = v²/(2a).
        double decel = demandG * IdealCar.G0 * IdealCar.MassKg / IdealCar.EffectiveMassKg();
        double v = r.Events.BrakeOnsetSpeedMps!.Value;
        Assert.Equal(v * v / (2 * decel), r.Events.StoppingDistanceM!.Value, 1e-2);
        Assert.Equal(v / decel, r.Events.StandstillS!.Value - r.Events.BrakeOnsetS!.Value, 1e-3);
    }

    [Fact]
    public void Power_limited_acceleration_follows_force_equals_power_over_speed()
    {
        const double PowerW = 50_000;
        SimulationResult r = Simulator.Run(IdealCar.Create(forceN: 10_000, powerW: PowerW, targetSpeedMps: 28), seed: 4);
        double t15 = FigureCalculator.SpeedCrossing(r.Truth, 0, 15)!.Value.Value;
        double t25 = FigureCalculator.SpeedCrossing(r.Truth, 0, 25)!.Value.Value;

        // Work–energy theorem with F = P/v (any mechanics textbook): m·v·dv/dt = P, so
        // t(v1→v2) = m_eff·(v2² − v1²) / (2P). The force limit ends at P/F = 5 m/s, below 15 m/s.
        double expected = IdealCar.EffectiveMassKg() * ((25.0 * 25) - (15.0 * 15)) / (2 * PowerW);
        Assert.Equal(expected, t25 - t15, 1e-2);
        Assert.InRange((t25 - t15) / expected, 0.998, 1.002);
    }

    [Fact]
    public void Terminal_speed_is_where_drive_force_meets_drag_and_rolling_resistance()
    {
        const double Mass = 200;
        const double Force = 600;
        const double Rho = 1.2;
        const double Cda = 0.8;
        const double Crr = 0.01;
        Scenario s = IdealCar.Create(Force, massKg: Mass, targetSpeedMps: 60);
        s = s with
        {
            Vehicle = s.Vehicle with { DragAreaM2 = Cda, RollingResistanceCoefficient = Crr },
            Environment = s.Environment with { AirDensityKgM3 = Rho },
            Plan = s.Plan with { MaxDurationS = 70 },
        };
        SimulationResult r = Simulator.Run(s, seed: 5);

        // Road-load equation (any vehicle dynamics textbook, e.g. Gillespie ch. 4):
        // F = ½ρ·CdA·v² + C_rr·m·g at the terminal speed.
        double terminal = Math.Sqrt((Force - (Crr * Mass * IdealCar.G0)) / (0.5 * Rho * Cda));
        Assert.Equal(terminal, r.Truth.SpeedMps[^1], 1e-2);
    }

    [Fact]
    public void Grade_adds_its_weight_component()
    {
        const double GradePercent = 5;
        double a = 3.0;
        Scenario s = IdealCar.Create(a * IdealCar.EffectiveMassKg());
        s = s with { Environment = s.Environment with { GradePercent = GradePercent } };
        SimulationResult r = Simulator.Run(s, seed: 6);
        double t0 = r.Events.FirstMotionS!.Value;

        // Inclined plane (any textbook): the weight's component along a grade θ = atan(5 %)
        // takes g·sin θ·m/m_eff off the acceleration.
        double net = a - (IdealCar.G0 * Math.Sin(Math.Atan(GradePercent / 100)) * IdealCar.MassKg / IdealCar.EffectiveMassKg());
        Assert.Equal(0.5 * net * 4, TrajectoryAt.Distance(r.Truth, t0 + 2), 1e-3);
    }
}
