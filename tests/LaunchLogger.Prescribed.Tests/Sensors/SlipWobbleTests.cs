using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Tests.Sensors;

/// <summary>The wheel whose slip swings across its tyre's peak against a closed form: on a
/// constant-acceleration launch from rest (v = a·τ) a slip ratio κ(τ) adds ∫ κ·v dτ to the
/// wheel's distance (the longitudinal slip of SAE J670, (ω·r − v)/v; from memory), and for
/// κ = A·sin(ωτ), ∫0^τ A·sin(ωu)·a·u du = A·a·(sin(ωτ)/ω² − τ·cos(ωτ)/ω) (integration by parts;
/// any table of integrals, ∫ x·sin(ωx) dx).</summary>
public class SlipWobbleTests
{
    private const double Accel = 4;
    private const double IdleS = 1;

    private static MotionProfile Launch() => new MotionProfileBuilder().Hold(IdleS).Constant(3, Accel).Hold(1).Build();

    [Theory]
    [InlineData(0.08, 0.04, 30, 60, 0.25)]
    [InlineData(0.15, 0.05, 20, 100, 0.0)]
    [InlineData(0.10, 0.033, 12, 12, 0.6)]
    public void Every_edge_sits_where_the_closed_form_puts_the_wheel(double amplitude, double periodS, int cycles, int teeth, double phase)
    {
        const double circumference = 1.9;
        var wobble = new SlipWobble(amplitude, periodS, cycles);
        MotionProfile p = Launch();
        double[] edges = new WheelPickup(teeth, TyreModel.Calibrated(circumference), phase, Wobble: wobble).EdgeTimes(p);
        double pitch = circumference / teeth;
        double omega = 2 * Math.PI / periodS;
        double endS = periodS * cycles;
        Assert.True(endS < 3, "the swing ends inside the constant-acceleration launch");

        // Over whole periods the swing's lead is −A·a·T/ω (sin ωT = 0, cos ωT = 1).
        double lead = -amplitude * Accel * endS / omega;
        double total = (0.5 * Accel * 9) + (Accel * 3) + lead;
        Assert.Equal((int)Math.Floor((total / pitch) - phase) + 1, edges.Length);
        for (int k = 0; k < edges.Length; k++)
        {
            double tau = edges[k] - IdleS;
            double wheel = (k + phase) * pitch;
            double expected = tau >= 3 ? (0.5 * Accel * 9) + (Accel * 3 * (tau - 3)) + lead
                : tau >= endS ? (0.5 * Accel * tau * tau) + lead
                : (0.5 * Accel * tau * tau) + (amplitude * Accel * ((Math.Sin(omega * tau) / (omega * omega)) - (tau * Math.Cos(omega * tau) / omega)));
            Assert.Equal(wheel, expected, 8);
        }
    }

    [Fact]
    public void The_swing_is_zero_before_first_motion_and_after_its_last_cycle_and_A_at_a_quarter_period()
    {
        var wobble = new SlipWobble(0.1, 0.04, 5);
        Assert.Equal(0, wobble.At(-0.01));
        Assert.Equal(0, wobble.At(0.2));
        Assert.Equal(0.1, wobble.At(0.01), 12);
        Assert.Equal(-0.1, wobble.At(0.03), 12);
    }

    [Fact]
    public void An_undriven_wheel_cannot_swing()
    {
        var pickup = new WheelPickup(24, TyreModel.Calibrated(1.9), Wobble: new SlipWobble(0.1, 0.04, 5), SpinUp: new SpinUpLag(1, 0.3, 3700, 25));
        Assert.Throws<ArgumentException>(() => pickup.EdgeTimes(Launch()));
    }
}
