using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Reference;

/// <summary>The generator's trajectories and truth figures against closed forms and the worked
/// values in shared REFERENCES.md.</summary>
public class ClosedFormTests
{
    private const double G = 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)

    [Fact]
    public void Half_g_from_rest_gives_the_reference_rollout_and_0_to_60_times()
    {
        MotionProfile p = new MotionProfileBuilder().Hold(1).Constant(10, 0.5 * G).Build();
        TruthRun run = Assert.Single(TruthCalculator.Compute(p));

        // REFERENCES.md, kinematics: at a constant 0.5 g from rest, 1 ft takes 0.35260 s; 0–60 mph
        // takes 5.4702 s from standstill and 5.1177 s once the first foot is subtracted.
        Assert.Equal(1.0, run.FirstMotionS);
        Assert.Equal(0.35260, run.RolloutS!.Value - 1, 5);
        TruthInterval zeroTo60 = run.Interval(TruthSpeedSpan.Mph(0, 60))!;
        Assert.Equal(5.4702, zeroTo60.FromStandstillS!.Value, 4);
        Assert.Equal(5.1177, zeroTo60.FromRolloutS!.Value, 4);
    }

    [Theory]
    [InlineData(2.0, 1.0)]
    [InlineData(4.0, 3.0)]
    [InlineData(9.0, 7.5)]
    public void Constant_acceleration_covers_a_t_squared_over_two(double accelMps2, double timeS)
    {
        MotionProfile p = new MotionProfileBuilder().Constant(20, accelMps2).Build();

        // d = a·t²/2, v = a·t (kinematics, any textbook).
        MotionState s = p.StateAt(timeS);
        Assert.Equal(accelMps2 * timeS * timeS / 2, s.DistanceM, 12);
        Assert.Equal(accelMps2 * timeS, s.SpeedMps, 12);
        Assert.Equal(Math.Sqrt(2 * 50 / accelMps2), p.TimeAtDistance(50)!.Value, 10);
    }

    [Fact]
    public void A_stop_from_60_mph_in_100_ft_is_the_reference_deceleration()
    {
        // REFERENCES.md, kinematics: from 60 mph, 100 ft of stopping → 1.2035 g (d = v²/2a).
        double v = 60 * TruthUnits.MpsPerMph;
        double a = v * v / (2 * 100 * TruthUnits.MetresPerFoot);
        Assert.Equal(1.2035, a / G, 4);
        MotionProfile p = new MotionProfileBuilder(v).Hold(0.5).BrakeToStop(0, a).Hold(1).Build();
        TruthStop stop = Assert.Single(TruthCalculator.Compute(p)).Stop!;

        Assert.Equal(100 * TruthUnits.MetresPerFoot, stop.StoppingDistanceM, 9);
        Assert.Equal(0.5 + (v / a), stop.StandstillS, 9);
        Assert.Equal(a, stop.MfddMps2, 9);
        Assert.Equal(0, p.StateAt(stop.StandstillS + 0.5).SpeedMps);
    }

    [Fact]
    public void The_un_r13_worked_example_gives_its_distances_and_mfdd()
    {
        // REFERENCES.md, braking (UN Regulation No. 13-H): 100 km/h, 0.3 s dead time then 8 m/s²
        // → s_b = 25.6944 m, s_e = 56.0764 m, d_m = 8.0000.
        double v0 = 100 / 3.6;
        MotionProfile p = new MotionProfileBuilder(v0).Hold(0.3).BrakeToStop(0, 8).Build();
        double sb = p.StateAt(p.TimeAtSpeed(0.8 * v0, 0, rising: false)!.Value).DistanceM;
        double se = p.StateAt(p.TimeAtSpeed(0.1 * v0, 0, rising: false)!.Value).DistanceM;
        Assert.Equal(25.6944, sb, 4);
        Assert.Equal(56.0764, se, 4);
        double vb = 0.8 * 100;
        double ve = 0.1 * 100;
        Assert.Equal(8.0000, ((vb * vb) - (ve * ve)) / (25.92 * (se - sb)), 4);
        Assert.Equal(8.0, Assert.Single(TruthCalculator.Compute(p)).Stop!.MfddMps2, 9);
    }

    [Fact]
    public void Trap_speed_at_constant_speed_is_45_over_the_66_ft_time()
    {
        // REFERENCES.md, drag-strip conventions: with Δt over 66 ft, mph = 45/Δt (common practice).
        double a = 6;
        double cruise = 30;
        double reach = cruise / a;
        MotionProfile p = new MotionProfileBuilder().Constant(reach, a).Hold(30).Build();
        TruthRun run = Assert.Single(TruthCalculator.Compute(p));
        TruthMark quarter = run.Mark(1320 * TruthUnits.MetresPerFoot)!;
        double dt = 66 * TruthUnits.MetresPerFoot / cruise;
        Assert.Equal(45 / dt, quarter.TrapSpeedMps!.Value / TruthUnits.MpsPerMph, 9);

        // Elapsed time: the ramp to speed, then the rest of the distance at that speed.
        double d = 1320 * TruthUnits.MetresPerFoot;
        Assert.Equal(reach + ((d - (cruise * reach / 2)) / cruise), quarter.FromStandstillS!.Value, 9);
    }

    [Fact]
    public void A_jerk_limited_start_covers_j_t_cubed_over_six()
    {
        // From rest at constant jerk j: a = j·t, v = j·t²/2, d = j·t³/6 (kinematics).
        double j = 20;
        MotionProfile p = new MotionProfileBuilder().Hold(2).Ramp(0.5, 0, j * 0.5).Constant(5, j * 0.5).Build();
        MotionState s = p.StateAt(2.4);
        Assert.Equal(j * Math.Pow(0.4, 3) / 6, s.DistanceM, 12);
        Assert.Equal(j * 0.4 * 0.4 / 2, s.SpeedMps, 12);
        Assert.Equal(2.0, Assert.Single(TruthCalculator.Compute(p)).FirstMotionS);
    }

    [Fact]
    public void A_deceleration_rising_steadily_stops_the_car_where_the_closed_form_says()
    {
        // a = −j·t from v₀: v = v₀ − j·t²/2 = 0 at t = √(2v₀/j); d = v₀·t − j·t³/6 = (2/3)·v₀·t.
        double v0 = 25;
        double j = 6;
        MotionProfile p = new MotionProfileBuilder(v0).Hold(1).BrakeRisingToStop(j).Hold(2).Build();
        TruthStop stop = Assert.Single(TruthCalculator.Compute(p)).Stop!;
        double t = Math.Sqrt(2 * v0 / j);
        Assert.Equal(1 + t, stop.StandstillS, 9);
        Assert.Equal(2.0 / 3.0 * v0 * t, stop.StoppingDistanceM, 9);
        Assert.Equal(1.0, stop.OnsetS);
    }
}
