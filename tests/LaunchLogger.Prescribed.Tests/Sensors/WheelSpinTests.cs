using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Tests.Sensors;

/// <summary>The spinning wheel against closed forms: on a constant-acceleration launch from rest
/// (v = a·τ) a slip ratio κ(τ) adds ∫ κ·v dτ to the wheel's distance (the longitudinal slip of
/// SAE J670, (ω·r − v)/v; from memory).</summary>
public class WheelSpinTests
{
    private const double Accel = 4;
    private const double IdleS = 1;

    private static MotionProfile Launch() => new MotionProfileBuilder().Hold(IdleS).Constant(3, Accel).Hold(1).Build();

    [Theory]
    [InlineData(0.0, 0.5, 0.2, 24, 0.3)]
    [InlineData(0.1, 1.0, 0.3, 48, 0.0)]
    [InlineData(0.25, 0.3, 0.1, 100, 0.7)]
    public void A_step_spin_puts_the_wheel_ahead_by_kappa_times_the_distance_covered_in_it(double afterS, double slip, double holdS, int teeth, double phase)
    {
        // Rise and fall at once: the wheel covers (1 + κ) times the road over the spin, the road's
        // distance elsewhere (the launch's 18 m, then 1 s at 12 m/s).
        double circumference = 1.9;
        var pickup = new WheelPickup(teeth, TyreModel.Calibrated(circumference), phase, Spin: new WheelSpin(afterS, slip, 0, holdS, 0));
        MotionProfile p = Launch();
        double[] edges = pickup.EdgeTimes(p);
        double pitch = circumference / teeth;
        double from = 0.5 * Accel * afterS * afterS;
        double to = 0.5 * Accel * (afterS + holdS) * (afterS + holdS);
        double total = (0.5 * Accel * 9) + (Accel * 3) + (slip * (to - from));
        Assert.Equal((int)Math.Floor((total / pitch) - phase) + 1, edges.Length);
        for (int k = 0; k < edges.Length; k++)
        {
            double wheel = (k + phase) * pitch;
            double road = wheel <= from ? wheel : wheel <= from + ((1 + slip) * (to - from)) ? from + ((wheel - from) / (1 + slip)) : wheel - (slip * (to - from));
            Assert.Equal(road, p.StateAt(edges[k]).DistanceM, 8);
        }
    }

    [Theory]
    [InlineData(0.0, 0.6, 0.05, 0.2, 0.08)]
    [InlineData(0.15, 0.3, 0.1, 0.05, 0.05)]
    public void A_raised_cosine_spin_leaves_the_wheel_ahead_by_its_closed_form_integral(double afterS, double slip, double riseS, double holdS, double fallS)
    {
        // ∫ κ·a·τ dτ in closed form: over a raised-cosine rise of R from τ0,
        // κa/2·(τ0·R + R²/2 + 2R²/π²) (∫0^R u·cos(πu/R) du = −2R²/π²); over the fall of F from τ1,
        // κa/2·(τ1·F + F²/2 − 2F²/π²); over the hold from τ0 + R to τ1, κa·(τ1² − (τ0 + R)²)/2.
        double t0 = afterS;
        double t1 = afterS + riseS + holdS;
        double ahead = (0.5 * slip * Accel * ((t0 * riseS) + (0.5 * riseS * riseS) + (2 * riseS * riseS / (Math.PI * Math.PI))))
            + (0.5 * slip * Accel * ((t1 * t1) - ((t0 + riseS) * (t0 + riseS))))
            + (0.5 * slip * Accel * ((t1 * fallS) + (0.5 * fallS * fallS) - (2 * fallS * fallS / (Math.PI * Math.PI))));
        var spin = new WheelSpin(afterS, slip, riseS, holdS, fallS);
        double circumference = 1.9;
        const int teeth = 60;
        const double phase = 0.25;
        MotionProfile p = Launch();
        double[] edges = new WheelPickup(teeth, TyreModel.Calibrated(circumference), phase, Spin: spin).EdgeTimes(p);
        double pitch = circumference / teeth;
        double over = 0.5 * Accel * spin.EndsAfterS * spin.EndsAfterS;
        int checkedEdges = 0;
        for (int k = 0; k < edges.Length; k++)
        {
            double wheel = (k + phase) * pitch;
            if (edges[k] - IdleS > spin.EndsAfterS)
            {
                Assert.Equal(wheel - ahead, p.StateAt(edges[k]).DistanceM, 8);
                checkedEdges++;
            }
            else if (edges[k] - IdleS < afterS)
            {
                Assert.Equal(wheel, p.StateAt(edges[k]).DistanceM, 8);
            }
        }

        Assert.True(checkedEdges > 100 && over < 2, $"{checkedEdges} edges after the spin");
    }

    [Fact]
    public void The_slip_rises_holds_and_falls_back_to_nothing()
    {
        var spin = new WheelSpin(0.1, 0.8, 0.04, 0.2, 0.06);
        Assert.Equal(0, spin.At(0.05));
        Assert.Equal(0.4, spin.At(0.12), 12);
        Assert.Equal(0.8, spin.At(0.2), 12);
        Assert.Equal(0.4, spin.At(0.37), 12);
        Assert.Equal(0, spin.At(0.4));
        Assert.Equal(0.4, spin.EndsAfterS, 12);
    }

    [Fact]
    public void Drawn_spins_lie_in_their_ranges()
    {
        var random = new Random(5);
        for (int i = 0; i < 200; i++)
        {
            WheelSpin spin = WheelSpin.Draw(random);
            Assert.InRange(spin.AfterS, 0, 0.2);
            Assert.InRange(spin.PeakSlip, 0.3, 1.0);
            Assert.InRange(spin.EndsAfterS - spin.AfterS, 0.12, 0.5);
        }
    }

    [Fact]
    public void An_undriven_wheel_cannot_spin()
    {
        var pickup = new WheelPickup(24, TyreModel.Calibrated(1.9), Spin: new WheelSpin(0, 0.5, 0.05, 0.1, 0.05), SpinUp: new SpinUpLag(1, 0.3, 3700, 25));
        Assert.Throws<ArgumentException>(() => pickup.EdgeTimes(Launch()));
    }
}
