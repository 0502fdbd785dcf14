using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Tests.Support;
using LaunchLogger.Simulation.Vehicle;

namespace LaunchLogger.Simulation.Tests.Vehicle;

public sealed class VehicleModelTests
{
    private static VehicleModel Accelerate(Scenario s, double seconds)
    {
        var model = new VehicleModel(s, Simulator.StepS);
        model.Launch();
        for (int i = 0; i < seconds / Simulator.StepS; i++)
        {
            model.Step();
        }

        return model;
    }

    [Fact]
    public void Weight_shifts_rearward_by_m_a_h_over_l()
    {
        double a = 3;
        Scenario s = IdealCar.Create(a * IdealCar.EffectiveMassKg());
        VehicleModel model = Accelerate(s, 1.0);

        // Weight transfer (Gillespie, Fundamentals of Vehicle Dynamics, ch. 2): moments about the
        // rear contact patch give N_f = W·(front share) − m·a·h/L.
        double weight = IdealCar.MassKg * IdealCar.G0;
        double shift = IdealCar.MassKg * a * s.Vehicle.CgHeightM / s.Vehicle.WheelbaseM;
        Assert.Equal((weight * s.Vehicle.FrontWeightFraction) - shift, model.LoadFrontN, 1.0);
        Assert.Equal(weight, model.LoadFrontN + model.LoadRearN, 1e-6);
    }

    [Fact]
    public void Body_squats_under_acceleration_by_moment_over_stiffness()
    {
        double a = 3;
        Scenario s = IdealCar.Create(a * IdealCar.EffectiveMassKg());
        VehicleModel model = Accelerate(s, 4.0);

        // Static equilibrium of a torsion spring (Hooke's law, any textbook): φ = M / k with the
        // pitching moment M = m·a·h; nose up under acceleration. After 4 s the 1.6 Hz pitch mode
        // with damping ratio 0.35 has long settled.
        double expected = IdealCar.MassKg * a * s.Vehicle.CgHeightM / s.Vehicle.PitchStiffnessNmPerRad;
        Assert.True(model.PitchRad > 0);
        Assert.Equal(expected, model.PitchRad, 2e-5);
    }

    [Fact]
    public void A_driven_wheel_spins_faster_than_the_road_when_torque_exceeds_grip()
    {
        Scenario s = IdealCar.Create(2.5 * IdealCar.G0 * IdealCar.MassKg);
        s = s with { Tyre = s.Tyre with { PeakFriction = 0.8, PeakSlip = 0.1 } };
        VehicleModel model = Accelerate(s, 1.0);

        // Driven rear, undriven front: the rear wheel's surface speed runs well ahead of the car,
        // the front one rolls with it (common practice: wheelspin overstates a driven-wheel pickup).
        double r = model.RollingRadius(model.SpeedMps);
        Assert.True(model.OmegaRear * r > 1.3 * model.SpeedMps);
        Assert.Equal(model.SpeedMps, model.OmegaFront * r, 1e-2);

        // Grip limits the acceleration to μ times the load on the driven axle (Coulomb friction,
        // any mechanics textbook): no more than μ·g with all the weight on it, and no less than
        // the sliding friction's floor (half the peak, the tyre curve's lower clamp) times the
        // rear axle's static share of the weight (1 − 0.6), since weight only moves rearwards.
        Assert.InRange(model.AccelMps2, 0.5 * 0.8 * IdealCar.G0 * (1 - s.Vehicle.FrontWeightFraction), 0.8 * IdealCar.G0);
    }

    [Fact]
    public void Never_rolls_backwards_and_stops_at_rest()
    {
        Scenario s = IdealCar.Create(2 * IdealCar.EffectiveMassKg());
        var model = new VehicleModel(s, Simulator.StepS);
        model.Launch();
        for (int i = 0; i < 20_000; i++)
        {
            model.Step();
        }

        model.Brake(1.0);
        double? stopped = null;
        for (int i = 0; i < 100_000 && stopped is null; i++)
        {
            model.Step();
            stopped = model.StoppedAtS;
        }

        Assert.NotNull(stopped);
        for (int i = 0; i < 10_000; i++)
        {
            model.Step();
            Assert.Equal(0, model.SpeedMps);
        }
    }
}
