using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.OdeSolvers;
using MathNet.Numerics.RootFinding;

namespace LaunchLogger.Prescribed.Tests.Reference;

/// <summary>The lagged take-up (a ramped demand through a first-order lag) against its defining
/// equation, solved by a reference library, and against its series at the start.</summary>
public class LaggedLaunchTests
{
    private const double G = 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)

    // Demand ramp, s; peak, g; lag, s: the generator's corners (ramps 0.05–0.4 s, peaks
    // 0.25–1.1 g, lags 0.02–0.15 s) and a middle.
    public static TheoryData<double, double, double> TakeUps => new()
    {
        { 0.05, 0.25, 0.15 },
        { 0.05, 1.1, 0.02 },
        { 0.2, 0.7, 0.08 },
        { 0.4, 1.1, 0.02 },
        { 0.4, 0.25, 0.15 },
    };

    [Theory]
    [MemberData(nameof(TakeUps))]
    public void The_closed_forms_follow_the_lag_equation_as_MathNets_Runge_Kutta_solves_it(double rampS, double peakG, double lagS)
    {
        var segment = new LaggedRampSegment(rampS, peakG * G, lagS);
        double k = peakG * G / rampS;

        // λ·a′ + a = k·τ, a(0) = 0, with v′ = a and x′ = v from rest, as a system for MathNet's
        // classical fourth-order Runge–Kutta (MathNet.Numerics.OdeSolvers.RungeKutta.FourthOrder;
        // Butcher, Numerical Methods for ODEs, 2016, §23) on 40 000 equal steps: its error, of
        // order (h/λ)⁴, is under 1e-12 of the values here.
        const int points = 40_001;
        double end = segment.DurationS;
        Vector<double>[] ode = RungeKutta.FourthOrder(
            Vector<double>.Build.Dense(3),
            0,
            end,
            points,
            (tau, y) => Vector<double>.Build.DenseOfArray([y[1], y[2], ((k * tau) - y[2]) / lagS]));

        MotionState last = StateOf(segment, end);
        for (int i = 0; i <= 20; i++)
        {
            int n = (points - 1) * i / 20;
            double tau = end * n / (points - 1);
            Vector<double> y = ode[n];
            Assert.True(Math.Abs(segment.DistanceGainM(tau) - y[0]) <= 1e-9 * last.DistanceM, $"Δx at τ = {tau}: {segment.DistanceGainM(tau):R} vs {y[0]:R}");
            Assert.True(Math.Abs(segment.SpeedGainMps(tau) - y[1]) <= 1e-9 * last.SpeedMps, $"Δv at τ = {tau}: {segment.SpeedGainMps(tau):R} vs {y[1]:R}");
            Assert.True(Math.Abs(segment.AccelMps2(tau) - y[2]) <= 1e-9 * last.AccelMps2, $"a at τ = {tau}: {segment.AccelMps2(tau):R} vs {y[2]:R}");
        }
    }

    [Theory]
    [MemberData(nameof(TakeUps))]
    public void The_speed_and_distance_are_the_lag_equation_integrated_once_and_twice(double rampS, double peakG, double lagS)
    {
        // Integrating λ·a′ + a = k·τ from rest (by hand): λ·a + Δv = k·τ²/2, and again,
        // λ·Δv + Δx = k·τ³/6. Both sides' terms are positive, so the check keeps its digits at
        // every τ; it holds the three forms to each other (a form left direct near the start
        // passes it, its rounding shared by all three: their digits there are the Taylor test's).
        var segment = new LaggedRampSegment(rampS, peakG * G, lagS);
        double k = peakG * G / rampS;
        for (int i = 1; i <= 40; i++)
        {
            double tau = segment.DurationS * Math.Pow(10, -6 + (6.0 * i / 40));
            AssertRelative(k * tau * tau / 2, (lagS * segment.AccelMps2(tau)) + segment.SpeedGainMps(tau), 1e-13);
            AssertRelative(k * tau * tau * tau / 6, (lagS * segment.SpeedGainMps(tau)) + segment.DistanceGainM(tau), 1e-13);
        }
    }

    [Theory]
    [InlineData(1e-6)]
    [InlineData(1e-4)]
    [InlineData(1e-3)]
    public void Near_the_start_the_segment_keeps_its_digits_as_the_Taylor_series_shows(double fraction)
    {
        // With u = τ/λ and e^(−u) by its Maclaurin series (any calculus text):
        // a = k·τ²/(2λ)·(1 − u/3 + u²/12 − u³/60 + …), Δv = k·τ³/(6λ)·(1 − u/4 + u²/20 − u³/120 + …),
        // Δx = k·τ⁴/(24λ)·(1 − u/5 + u²/30 − u³/210 + …); the terms left off are under u⁴/300 of
        // the sum, below 1e-14 for u ≤ 1e-3.
        const double rampS = 0.2;
        const double peak = 0.7 * G;
        const double lagS = 0.08;
        const double k = peak / rampS;
        double tau = fraction * lagS;
        double u = fraction;
        var segment = new LaggedRampSegment(rampS, peak, lagS);
        const double tolerance = 1e-13;
        AssertRelative(k * tau * tau / (2 * lagS) * (1 - (u / 3) + (u * u / 12) - (u * u * u / 60)), segment.AccelMps2(tau), tolerance);
        AssertRelative(k * tau * tau * tau / (6 * lagS) * (1 - (u / 4) + (u * u / 20) - (u * u * u / 120)), segment.SpeedGainMps(tau), tolerance);
        AssertRelative(k * tau * tau * tau * tau / (24 * lagS) * (1 - (u / 5) + (u * u / 30) - (u * u * u / 210)), segment.DistanceGainM(tau), tolerance);
    }

    [Theory]
    [MemberData(nameof(TakeUps))]
    public void It_ends_where_the_acceleration_reaches_the_peak_as_Brents_method_finds_it(double rampS, double peakG, double lagS)
    {
        // a(τ) = k·(τ − λ·(1 − e^(−τ/λ))) written plainly, its root a = A by MathNet's Brent
        // (Brent, Algorithms for Minimization without Derivatives, 1973, ch. 4); the root lies
        // between T and T + λ (a(T) < A ≤ a(T + λ), by hand).
        double peak = peakG * G;
        double k = peak / rampS;
        double root = Brent.FindRoot(tau => (k * (tau - (lagS * (1 - Math.Exp(-tau / lagS))))) - peak, rampS, rampS + lagS, 1e-15, 200);
        var segment = new LaggedRampSegment(rampS, peak, lagS);
        Assert.InRange(segment.DurationS, rampS, rampS + lagS);
        AssertRelative(root, segment.DurationS, 1e-12);
        AssertRelative(peak, segment.AccelMps2(segment.DurationS), 1e-13);

        // The jerk there is a′ = k·(1 − e^(−τ/λ)) (differentiating a by hand): close to the ramp's
        // k once the lag has settled, never above it.
        AssertRelative(k * (1 - Math.Exp(-root / lagS)), segment.EndJerkMps3, 1e-12);
        Assert.True(segment.EndJerkMps3 < k);
    }

    [Fact]
    public void A_take_up_joins_its_pull_without_a_step_in_acceleration()
    {
        const double peak = 0.8 * G;
        var rise = new LaggedRampSegment(0.15, peak, 0.06);
        MotionProfile p = new MotionProfileBuilder().Hold(1).Then(rise).Exponential(5, peak, 0.1 * G, 6).Build();
        double join = 1 + rise.DurationS;

        // Continuous a: either side of the join the acceleration differs by no more than the
        // slopes carry it over 1 µs (|a′| ≤ k either side; a step would show as a jump of order A).
        double before = p.StateAt(join - 1e-6).AccelMps2;
        double after = p.StateAt(join + 1e-6).AccelMps2;
        Assert.True(Math.Abs(after - before) <= 2e-6 * rise.RateMps3, $"{before:R} → {after:R}");
        AssertRelative(peak, p.StateAt(join).AccelMps2, 1e-12);

        // The jerk steps from k·(1 − e^(−τₚ/λ)) to the pull's −(A − a∞)/T (differentiating
        // the exponential by hand), as it does after a linear ramp.
        double jerkBefore = (before - p.StateAt(join - 2e-6).AccelMps2) / 1e-6;
        double jerkAfter = (p.StateAt(join + 2e-6).AccelMps2 - after) / 1e-6;
        Assert.Equal(rise.EndJerkMps3, jerkBefore, 0.01 * rise.EndJerkMps3);
        Assert.Equal(-(peak - (0.1 * G)) / 6, jerkAfter, 0.01);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(7)]
    [InlineData(42)]
    public void A_lagged_standing_start_draws_the_same_car_as_the_linear_one(int seed)
    {
        Shape linear = PrescribedShapes.StandingStart(new Random(seed));
        Shape lagged = PrescribedShapes.StandingStart(new Random(seed), takeUp: LaunchTakeUp.Lagged);
        TruthRun lt = Assert.Single(TruthCalculator.Compute(linear.Profile));
        TruthRun gt = Assert.Single(TruthCalculator.Compute(lagged.Profile));
        Assert.Equal(PrescribedShapes.IdleS, lt.FirstMotionS!.Value, 9);
        Assert.Equal(PrescribedShapes.IdleS, gt.FirstMotionS!.Value, 9);

        // The same demand ramp (k = A/T) and peak; the lagged rise ends later, where its speed is
        // k·τₚ²/2 − λ·A (the lag equation integrated once, above); the pull after it is the same
        // curve, so its acceleration is the linear car's shifted by τₚ − T.
        var ramp = (RampSegment)linear.Profile.Segments[1].Segment;
        var lag = (LaggedRampSegment)lagged.Profile.Segments[1].Segment;
        Assert.Equal(ramp.To, lag.Peak);
        Assert.Equal(ramp.DurationS, lag.RampS);
        Assert.InRange(lag.LagS, 0.02, 0.15);
        double tp = lag.DurationS;
        AssertRelative((lag.RateMps3 * tp * tp / 2) - (lag.LagS * lag.Peak), lagged.Profile.StateAt(PrescribedShapes.IdleS + tp).SpeedMps, 1e-12);
        foreach (double s in new[] { 0.5, 1.7, 4.2 })
        {
            Assert.Equal(linear.Profile.StateAt(PrescribedShapes.IdleS + ramp.DurationS + s).AccelMps2, lagged.Profile.StateAt(PrescribedShapes.IdleS + tp + s).AccelMps2, 12);
        }

        // The brakes too are the same draws: the stops differ only in where they start.
        Assert.Equal(linear.Profile.Runs[0].BrakeRiseS, lagged.Profile.Runs[0].BrakeRiseS);
        Assert.Equal(linear.Profile.Segments[^2].Segment.AccelMps2(0), lagged.Profile.Segments[^2].Segment.AccelMps2(0));
        Assert.Equal(linear.Name.Replace(" s,", FormattableString.Invariant($" s (lag {lag.LagS:0.000} s),"), StringComparison.Ordinal), lagged.Name);
    }

    private static MotionState StateOf(AccelSegment segment, double tau) =>
        new(tau, segment.DistanceGainM(tau), segment.SpeedGainMps(tau), segment.AccelMps2(tau));

    private static void AssertRelative(double expected, double actual, double relative) =>
        Assert.True(Math.Abs(actual - expected) <= relative * Math.Abs(expected), $"expected {expected:R}, got {actual:R} (relative {(actual - expected) / expected:E2}, allowed {relative:E0})");
}
