using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Reference;

/// <summary>The smooth (raised-cosine) launch rise against its closed forms.</summary>
public class SmoothLaunchTests
{
    private const double G = 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)

    [Theory]
    [InlineData(0.05, 0.25)]
    [InlineData(0.2, 0.7)]
    [InlineData(0.4, 1.1)]
    public void A_raised_cosine_rise_gains_half_peak_times_T_and_its_closed_form_distance(double riseS, double peakG)
    {
        double peak = peakG * G;
        MotionProfile p = new MotionProfileBuilder().Hold(1).Then(PrescribedShapes.SmoothRise(riseS, peak)).Constant(1, peak).Build();

        // a(τ) = A(1 − cos(πτ/T))/2 integrates to v(τ) = A/2·(τ − (T/π)·sin(πτ/T)) and
        // x(τ) = A/2·(τ²/2 + (T/π)²·(cos(πτ/T) − 1)): over the whole rise v = A·T/2 and
        // x = A·T²·(1/4 − 1/π²) (integrated by hand).
        MotionState end = p.StateAt(1 + riseS);
        Assert.Equal(peak * riseS / 2, end.SpeedMps, 10);
        Assert.Equal(peak * riseS * riseS * (0.25 - (1 / (Math.PI * Math.PI))), end.DistanceM, 10);

        double tau = 0.3 * riseS;
        MotionState mid = p.StateAt(1 + tau);
        double w = Math.PI / riseS;
        Assert.Equal(peak / 2 * (1 - Math.Cos(w * tau)), mid.AccelMps2, 10);
        Assert.Equal(peak / 2 * (tau - (Math.Sin(w * tau) / w)), mid.SpeedMps, 10);
        Assert.Equal(peak / 2 * ((tau * tau / 2) + ((Math.Cos(w * tau) - 1) / (w * w))), mid.DistanceM, 10);

        // The jerk starts from zero: at τ = T/100, a = A·(1 − cos(π/100))/2 ≈ A·π²/40000, a
        // fortieth of a linear ramp's A/100 there.
        double early = 0.01 * riseS;
        Assert.True(p.StateAt(1 + early).AccelMps2 < 0.03 * peak * early / riseS);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(7)]
    [InlineData(42)]
    public void A_smooth_standing_start_draws_the_same_car_as_the_linear_one(int seed)
    {
        Shape linear = PrescribedShapes.StandingStart(new Random(seed));
        Shape smooth = PrescribedShapes.StandingStart(new Random(seed), smoothLaunch: true);
        TruthRun lt = Assert.Single(TruthCalculator.Compute(linear.Profile));
        TruthRun st = Assert.Single(TruthCalculator.Compute(smooth.Profile));

        // Both begin to move when the idle ends, and both rises gain peak·T/2 of speed (a linear
        // ramp's area is a triangle's, the raised cosine's half the rectangle's: closed forms),
        // so the speed once both have risen is the same; the smooth car has gone less far.
        Assert.Equal(PrescribedShapes.IdleS, lt.FirstMotionS!.Value, 9);
        Assert.Equal(PrescribedShapes.IdleS, st.FirstMotionS!.Value, 9);
        double after = PrescribedShapes.IdleS + 0.4;
        Assert.Equal(linear.Profile.StateAt(after).SpeedMps, smooth.Profile.StateAt(after).SpeedMps, 9);
        Assert.True(smooth.Profile.StateAt(after).DistanceM < linear.Profile.StateAt(after).DistanceM);
        Assert.Contains("(smooth)", smooth.Name, StringComparison.Ordinal);
    }
}
