using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Reference;

/// <summary>The smooth (raised-cosine) launch rise against its closed forms.</summary>
public class SmoothLaunchTests
{
    private const double G = 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)

    // Rise time, s, and peak, g: the generator's range (0.05–0.4 s, 0.25–1.1 g) and its middle.
    public static TheoryData<double, double> Rises => new() { { 0.05, 0.25 }, { 0.2, 0.7 }, { 0.4, 1.1 } };

    [Theory]
    [MemberData(nameof(Rises))]
    public void A_raised_cosine_rise_gains_half_peak_times_T_and_its_closed_form_distance(double riseS, double peakG)
    {
        double peak = peakG * G;
        MotionProfile p = new MotionProfileBuilder().Hold(1).Then(PrescribedShapes.SmoothRise(riseS, peak)).Constant(1, peak).Build();

        // Over the whole rise v = A·T/2 and x = A·T²·(1/4 − 1/π²) (integrated by hand).
        MotionState end = p.StateAt(1 + riseS);
        Assert.Equal(peak * riseS / 2, end.SpeedMps, 10);
        Assert.Equal(peak * riseS * riseS * (0.25 - (1 / (Math.PI * Math.PI))), end.DistanceM, 10);

        double tau = 0.3 * riseS;
        MotionState mid = p.StateAt(1 + tau);
        Assert.Equal(Accel(peak, riseS, tau), mid.AccelMps2, 10);
        Assert.Equal(SpeedGain(peak, riseS, tau), mid.SpeedMps, 10);
        Assert.Equal(DistanceGain(peak, riseS, tau), mid.DistanceM, 10);

        // The jerk starts from zero: at τ = T/100, a = A·(1 − cos(π/100))/2 ≈ A·π²/40000, a
        // fortieth of a linear ramp's A/100 there.
        double early = 0.01 * riseS;
        Assert.True(p.StateAt(1 + early).AccelMps2 < 0.03 * peak * early / riseS);
    }

    [Theory]
    [MemberData(nameof(Rises))]
    public void The_closed_form_segment_gives_the_hand_integrals_at_the_start_middle_and_end(double riseS, double peakG)
    {
        double peak = peakG * G;
        var rise = new RaisedCosineSegment(riseS, peak);
        Assert.Equal(0, rise.AccelMps2(0));
        Assert.Equal(0, rise.SpeedGainMps(0));
        Assert.Equal(0, rise.DistanceGainM(0));
        foreach (double tau in new[] { riseS / 2, riseS })
        {
            AssertRelative(Accel(peak, riseS, tau), rise.AccelMps2(tau), 1e-12);
            AssertRelative(SpeedGain(peak, riseS, tau), rise.SpeedGainMps(tau), 1e-12);
            AssertRelative(DistanceGain(peak, riseS, tau), rise.DistanceGainM(tau), 1e-12);
        }

        // Halfway a = A/2, v = A·T·(1/4 − 1/(2π)), x = A·T²·(1/16 − 1/(2π²)); at the end a = A,
        // v = A·T/2, x = A·T²·(1/4 − 1/π²) (the forms above at u = π/2 and π, by hand).
        AssertRelative(peak / 2, rise.AccelMps2(riseS / 2), 1e-12);
        AssertRelative(peak * riseS * (0.25 - (0.5 / Math.PI)), rise.SpeedGainMps(riseS / 2), 1e-12);
        AssertRelative(peak * riseS * riseS * ((1.0 / 16) - (0.5 / (Math.PI * Math.PI))), rise.DistanceGainM(riseS / 2), 1e-12);
        AssertRelative(peak, rise.AccelMps2(riseS), 1e-12);
        AssertRelative(peak * riseS / 2, rise.SpeedGainMps(riseS), 1e-12);
        AssertRelative(peak * riseS * riseS * (0.25 - (1 / (Math.PI * Math.PI))), rise.DistanceGainM(riseS), 1e-12);
    }

    [Theory]
    [InlineData(1e-6)]
    [InlineData(1e-3)]
    [InlineData(0.01)]
    public void Near_the_start_the_segment_keeps_its_digits_as_the_Taylor_series_shows(double fraction)
    {
        // With u = ωτ, ω = π/T, cos and sin by their Maclaurin series (any calculus text):
        // a = A·u²/4·(1 − u²/12 + u⁴/360 − …), Δv = A·ω²τ³/12·(1 − u²/20 + u⁴/840 − …),
        // Δx = A·ω²τ⁴/48·(1 − u²/30 + u⁴/1680 − …). The terms left off are under u⁶/20000 of
        // the sum: below 1e-12 for u ≤ π/100.
        const double riseS = 0.2;
        const double peak = 0.7 * G;
        double tau = fraction * riseS;
        double w = Math.PI / riseS;
        double u2 = w * w * tau * tau;
        var rise = new RaisedCosineSegment(riseS, peak);
        const double tolerance = 1e-12;
        AssertRelative(peak * u2 / 4 * (1 - (u2 / 12) + (u2 * u2 / 360)), rise.AccelMps2(tau), tolerance);
        AssertRelative(peak * w * w * tau * tau * tau / 12 * (1 - (u2 / 20) + (u2 * u2 / 840)), rise.SpeedGainMps(tau), tolerance);
        AssertRelative(peak * w * w * tau * tau * tau * tau / 48 * (1 - (u2 / 30) + (u2 * u2 / 1680)), rise.DistanceGainM(tau), tolerance);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(7)]
    [InlineData(42)]
    public void A_smooth_standing_start_draws_the_same_car_as_the_linear_one(int seed)
    {
        Shape linear = PrescribedShapes.StandingStart(new Random(seed));
        Shape smooth = PrescribedShapes.StandingStart(new Random(seed), takeUp: LaunchTakeUp.RaisedCosine);
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

    // a(τ) = A(1 − cos(πτ/T))/2 integrates to v(τ) = A/2·(τ − (T/π)·sin(πτ/T)) and
    // x(τ) = A/2·(τ²/2 + (T/π)²·(cos(πτ/T) − 1)) (integrated by hand), written plainly here: they
    // lose digits near τ = 0, which the Taylor test covers.
    private static double Accel(double peak, double riseS, double tau) => peak / 2 * (1 - Math.Cos(Math.PI * tau / riseS));

    private static double SpeedGain(double peak, double riseS, double tau)
    {
        double w = Math.PI / riseS;
        return peak / 2 * (tau - (Math.Sin(w * tau) / w));
    }

    private static double DistanceGain(double peak, double riseS, double tau)
    {
        double w = Math.PI / riseS;
        return peak / 2 * ((tau * tau / 2) + ((Math.Cos(w * tau) - 1) / (w * w)));
    }

    private static void AssertRelative(double expected, double actual, double relative) =>
        Assert.True(Math.Abs(actual - expected) <= relative * Math.Abs(expected), $"expected {expected:R}, got {actual:R} (relative {(actual - expected) / expected:E2}, allowed {relative:E0})");
}
