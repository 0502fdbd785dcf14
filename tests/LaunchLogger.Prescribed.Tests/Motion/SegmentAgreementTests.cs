using LaunchLogger.Prescribed.Motion;

namespace LaunchLogger.Prescribed.Tests.Motion;

/// <summary>The closed-form segments against the quadrature segment (adaptive Gauss–Kronrod, an
/// independent method) and the tabulated one on the same history.</summary>
public class SegmentAgreementTests
{
    public static TheoryData<string, AccelSegment> ClosedForms => new()
    {
        { "constant", new ConstantSegment(3, 4.5) },
        { "ramp up", new RampSegment(0.8, 0, 9) },
        { "ramp down", new RampSegment(2, 7, 1) },
        { "exponential, T 2 s", new ExponentialSegment(6, 8, 1.5, 2) },
        { "exponential, T 0.05 s", new ExponentialSegment(0.4, 0, -9, 0.05) },
        { "raised cosine, T 0.05 s", new RaisedCosineSegment(0.05, 2.5) },
        { "raised cosine, T 0.4 s", new RaisedCosineSegment(0.4, 10.8) },
        { "lagged ramp, T 0.2 s, λ 0.08 s", new LaggedRampSegment(0.2, 6.9, 0.08) },
        { "lagged ramp, T 0.05 s, λ 0.15 s", new LaggedRampSegment(0.05, 2.5, 0.15) },
    };

    [Theory]
    [MemberData(nameof(ClosedForms))]
    public void Closed_forms_match_adaptive_quadrature_of_the_same_acceleration(string name, AccelSegment closed)
    {
        var numeric = new FunctionSegment(closed.DurationS, closed.AccelMps2, name);
        for (int k = 0; k <= 10; k++)
        {
            double tau = closed.DurationS * k / 10;
            Assert.Equal(numeric.SpeedGainMps(tau), closed.SpeedGainMps(tau), 10);
            Assert.Equal(numeric.DistanceGainM(tau), closed.DistanceGainM(tau), 10);
        }
    }

    [Theory]
    [InlineData(0.05, 2.5)]
    [InlineData(0.2, 6.9)]
    [InlineData(0.4, 10.8)]
    public void A_raised_cosine_rise_matches_adaptive_quadrature_to_1e12_relative(double riseS, double peakMps2)
    {
        // The same a(τ) written out on its own, integrated by MathNet.Numerics' adaptive
        // Gauss–Kronrod (QUADPACK's 15-point rule, Piessens et al. 1983) to 1e-13; relative, so
        // that the early points, where the distance gained is as small as 1e-11 m, are held as tightly.
        var numeric = new FunctionSegment(riseS, tau => 0.5 * peakMps2 * (1 - Math.Cos(Math.PI * tau / riseS)), "raised cosine");
        var closed = new RaisedCosineSegment(riseS, peakMps2);
        for (int k = 1; k <= 20; k++)
        {
            double tau = riseS * k / 20;
            Assert.True(Math.Abs(closed.SpeedGainMps(tau) - numeric.SpeedGainMps(tau)) <= 1e-12 * numeric.SpeedGainMps(tau), $"Δv at τ = {tau}");
            Assert.True(Math.Abs(closed.DistanceGainM(tau) - numeric.DistanceGainM(tau)) <= 1e-12 * numeric.DistanceGainM(tau), $"Δx at τ = {tau}");
        }
    }

    [Fact]
    public void A_table_of_a_ramp_integrates_as_the_ramp()
    {
        // PCHIP reproduces data on a straight line exactly (its slopes are the chords').
        var ramp = new RampSegment(2, 1, 9);
        double[] times = [0, 0.5, 1, 1.5, 2];
        var table = new TabulatedSegment(times, times.Select(ramp.AccelMps2).ToArray());
        foreach (double tau in new[] { 0.1, 0.77, 1.5, 1.99 })
        {
            Assert.Equal(ramp.SpeedGainMps(tau), table.SpeedGainMps(tau), 12);
            Assert.Equal(ramp.DistanceGainM(tau), table.DistanceGainM(tau), 12);
        }
    }

    [Fact]
    public void A_table_of_a_curve_integrates_as_quadrature_of_its_interpolant()
    {
        double[] times = [0, 0.2, 0.6, 1.5, 3, 5];
        double[] accels = [0, 8, 9.5, 7, 4, 2.5];
        var table = new TabulatedSegment(times, accels);
        var numeric = new FunctionSegment(table.DurationS, table.AccelMps2, "interpolant");
        foreach (double tau in new[] { 0.1, 1, 2.2, 5 })
        {
            Assert.Equal(numeric.SpeedGainMps(tau), table.SpeedGainMps(tau), 9);
            Assert.Equal(numeric.DistanceGainM(tau), table.DistanceGainM(tau), 9);
        }
    }

    [Fact]
    public void The_car_never_reverses_and_cannot_brake_at_rest()
    {
        MotionProfile p = new MotionProfileBuilder(10).Constant(5, -4).Hold(1).Build();
        Assert.Equal(2.5, p.Runs[0].StandstillS!.Value, 10);
        Assert.Equal(0, p.StateAt(4).SpeedMps);
        Assert.Equal(12.5, p.StateAt(6).DistanceM, 10);
        Assert.Throws<InvalidOperationException>(() => new MotionProfileBuilder().Hold(1).Constant(1, -2));
        Assert.Throws<InvalidOperationException>(() => new MotionProfileBuilder().BrakeToStop(0.2, 8));
    }

    [Fact]
    public void Stop_and_go_makes_two_standing_runs()
    {
        MotionProfile p = new MotionProfileBuilder().Hold(1).Constant(3, 5).BrakeToStop(0.2, 7).Hold(4).Constant(3, 4).BrakeToStop(0.3, 6).Hold(1).Build();
        Assert.Equal(2, p.Runs.Count);
        Assert.All(p.Runs, r => Assert.True(r.Standing));
        Assert.True(p.Runs[1].StartS > p.Runs[0].StandstillS!.Value + 3.99);
        Assert.Equal(4.0, p.Runs[0].BrakeOnsetS);
    }
}
