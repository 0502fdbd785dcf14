using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;
using LaunchLogger.Simulation.Tests.Support;

namespace LaunchLogger.Simulation.Tests.Sensors;

public sealed class PulsePickupTests
{
    [Theory]
    [InlineData(12, 1)]
    [InlineData(48, 1)]
    [InlineData(100, 1)]
    [InlineData(30, 2)]
    public void Counts_exactly_the_configured_edges_per_revolution(int teeth, int edgesPerTooth)
    {
        var pickup = new PulsePickup(new PulsePickupSpec { Teeth = teeth, EdgesPerTooth = edgesPerTooth, ToothSpacingErrorFraction = 0.02 }, new Random(1));

        // 10 revolutions in 1 s at constant speed, in 0.1 ms steps.
        const int Steps = 10_000;
        double omega = 10 * 2 * Math.PI;
        for (int i = 0; i < Steps; i++)
        {
            pickup.Advance(i * 1e-4, (i + 1) * 1e-4, i * 1e-3, (i + 1) * 1e-3, omega, omega);
        }

        // Common practice: a ring of N teeth gives N pulses per turn per counted edge.
        Assert.Equal(10 * teeth * edgesPerTooth, pickup.EdgeTimesS.Count);
        Assert.Equal(teeth * edgesPerTooth, pickup.PulsesPerRevolution);
        Assert.True(pickup.EdgeTimesS.Zip(pickup.EdgeTimesS.Skip(1)).All(p => p.Second > p.First));
    }

    [Fact]
    public void Edge_times_follow_constant_angular_acceleration_within_a_step()
    {
        var pickup = new PulsePickup(new PulsePickupSpec { Teeth = 1000, ToothSpacingErrorFraction = 0 }, new Random(2));

        // Rest to 2 rev/s² for 1 s in 0.1 ms steps: revs(t) = t² (kinematics, any textbook).
        double alpha = 2 * 2 * Math.PI;
        for (int i = 0; i < 10_000; i++)
        {
            double t0 = i * 1e-4;
            double t1 = t0 + 1e-4;
            pickup.Advance(t0, t1, t0 * t0, t1 * t1, alpha * t0, alpha * t1);
        }

        // Whatever the start offset, successive edges are 1/1000 rev apart: t_k² − t_(k−1)² = 0.001.
        var times = pickup.EdgeTimesS;
        for (int k = 1; k < times.Count; k++)
        {
            Assert.Equal(0.001, (times[k] * times[k]) - (times[k - 1] * times[k - 1]), 1e-9);
        }
    }

    [Theory]
    [InlineData(12)]
    [InlineData(48)]
    [InlineData(100)]
    public void Pulses_per_metre_on_an_undriven_wheel_match_teeth_over_circumference(int teeth)
    {
        Scenario s = IdealCar.Create(3 * IdealCar.EffectiveMassKg());
        s = s with
        {
            Pickup = s.Pickup with { Teeth = teeth, ToothSpacingErrorFraction = 0.01 },
            Tyre = s.Tyre with { RadiusGrowthAt30Mps = 0.01 },
        };
        SimulationResult r = Simulator.Run(s, seed: teeth);

        // The wheel turns ∫ v / r(v) dt, with r(v) = r0·(1 + 0.01·(v/30)²) as configured.
        double revs = 0;
        var t = r.Truth;
        for (int i = 1; i < t.Count; i++)
        {
            double v = 0.5 * (t.SpeedMps[i] + t.SpeedMps[i - 1]);
            double radius = IdealCar.RadiusM * (1 + (0.01 * (v / 30) * (v / 30)));
            revs += (t.DistanceM[i] - t.DistanceM[i - 1]) / (2 * Math.PI * radius);
        }

        Assert.InRange(r.Sensors.Pulses, (revs * teeth) - 1, (revs * teeth) + 1);

        // And fewer pulses than a fixed radius would give: the growth shows.
        double fixedRadiusPulses = r.Truth.DistanceM[^1] / (2 * Math.PI * IdealCar.RadiusM) * teeth;
        Assert.True(r.Sensors.Pulses < fixedRadiusPulses - 1);
    }
}
