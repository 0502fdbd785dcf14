using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The rolling-scale fit's terms for a window that opens moving: the integration errors'
/// covariances against numerical integration of their kernels, and the fit on motions written
/// from closed forms — stretches of constant acceleration, each covering v₀·τ + a·τ²/2 (any
/// kinematics text); every edge placed by bisection where the distance passes a tooth of a ring
/// that rolls <see cref="TrueScale"/> times the distance per pulse told; the accelerometer the
/// mean acceleration over each sample's period plus white noise.</summary>
public class RollingScaleFitTests
{
    private const double MetresPerPulse = 0.04;
    private const double TrueScale = 0.985;
    private const double RateHz = 500;
    private const double NoiseMps2 = 0.03;

    [Theory]
    [InlineData(0.02, 200)]
    [InlineData(0.06, 50)]
    public void A_gap_bridged_by_a_line_misses_the_speed_a_random_walk_acceleration_gains_across_it(double gapS, double jerkDensity)
    {
        // Monte Carlo: an acceleration that random-walks (white jerk of the density given) over
        // the gap, the line between its two ends taken in its place; the integral of the
        // difference is the speed the bridge misses. Its sample variance over 20 000 draws (1 %
        // standard error: √(2/n) for a Gaussian's variance) against j·Δ³/12.
        const int draws = 20000;
        const int steps = 200;
        var random = new Random(7);
        double h = gapS / steps;
        double sum = 0;
        double sumSquares = 0;
        var a = new double[steps + 1];
        for (int d = 0; d < draws; d++)
        {
            for (int i = 1; i <= steps; i++)
            {
                a[i] = a[i - 1] + (Math.Sqrt(jerkDensity * h) * Gaussian(random));
            }

            double missed = 0;
            for (int i = 0; i < steps; i++)
            {
                double line0 = a[steps] * i / steps;
                double line1 = a[steps] * (i + 1) / steps;
                missed += 0.5 * h * ((a[i] - line0) + (a[i + 1] - line1));
            }

            sum += missed;
            sumSquares += missed * missed;
        }

        double variance = (sumSquares / draws) - Math.Pow(sum / draws, 2);
        (double mid, double told) = RollingScaleFit.Gap(1.0, 1.0 + gapS, 0.5, jerkDensity);
        Assert.Equal(0.5 + (gapS / 2), mid, 12);
        Assert.InRange(variance / told, 0.96, 1.04);
    }

    [Theory]
    [InlineData(1.3, false, 2.9, false)]
    [InlineData(2.9, false, 1.3, false)]
    [InlineData(1.3, true, 2.9, true)]
    [InlineData(1.3, true, 2.9, false)]
    [InlineData(2.9, true, 1.3, false)]
    [InlineData(2.0, true, 2.0, false)]
    [InlineData(2.0, true, 2.0, true)]
    public void The_error_covariances_equal_their_kernels_integrated(double tauA, bool speedA, double tauB, bool speedB)
    {
        // A speed at t carries white noise with the kernel 1 and a random walk with (t − u); a
        // distance at s with (s − u) and (s − u)²/2. Simpson's rule (exact for these polynomials
        // of degree ≤ 4 on each panel) over the common span, against the closed forms.
        double q = 3e-4;
        double r = 2e-5;
        double white = Simpson(u => WhiteKernel(tauA, speedA, u) * WhiteKernel(tauB, speedB, u), Math.Min(tauA, tauB));
        double walk = Simpson(u => WalkKernel(tauA, speedA, u) * WalkKernel(tauB, speedB, u), Math.Min(tauA, tauB));

        Assert.Equal(q * white, RollingScaleFit.ErrorCovariance(tauA, speedA, tauB, speedB, q, 0), 12);
        Assert.Equal(r * walk, RollingScaleFit.ErrorCovariance(tauA, speedA, tauB, speedB, 0, r), 12);
        Assert.Equal((q * white) + (r * walk), RollingScaleFit.ErrorCovariance(tauA, speedA, tauB, speedB, q, r), 12);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void A_stop_from_cruise_measures_the_scale_from_the_pulses_before_the_brakes_and_the_rest(int seed)
    {
        // 25 m/s for 3 s, then 6 m/s² to rest (25/6 s), then 2 s at rest.
        var motion = new Piecewise(25, [0, 3.0, 3.0 + (25 / 6.0)], [0, -6, 0]);
        double stop = 3.0 + (25 / 6.0);
        (double[] grid, double[] dv, double[] dd, PulseChannel pulses) = Record(motion, stop + 2, seed, brakeSlip: 0);

        RollingScale fit = FitStop(grid, dv, dd, pulses, stop)!.Value;

        Assert.True(Math.Abs(fit.Scale.Value - TrueScale) <= 3 * fit.Scale.Sigma, $"{fit.Scale} against {TrueScale}");

        // Far narrower than the 1 % prior: the speed before the brakes (25 m/s) is known from the
        // acceleration integrated down to the rest to a few centimetres per second.
        Assert.True(fit.Scale.Sigma < 0.003, $"{fit.Scale}");
        Assert.Equal(13, fit.RestEquations);
    }

    [Fact]
    public void The_braked_wheels_slip_does_not_reach_the_scale()
    {
        // Under braking the wheel turns 10 % slower than the car moves: the pulses there differ,
        // the fit reads none of them.
        var motion = new Piecewise(25, [0, 3.0, 3.0 + (25 / 6.0)], [0, -6, 0]);
        double stop = 3.0 + (25 / 6.0);
        (double[] grid, double[] dv, double[] dd, PulseChannel rolling) = Record(motion, stop + 2, 4, brakeSlip: 0);
        (_, _, _, PulseChannel slipping) = Record(motion, stop + 2, 4, brakeSlip: 0.10);

        Assert.NotEqual(rolling.Counts[^1], slipping.Counts[^1]);
        Assert.Equal(FitStop(grid, dv, dd, rolling, stop)!.Value.Scale, FitStop(grid, dv, dd, slipping, stop)!.Value.Scale);
    }

    [Theory]
    [InlineData(5)]
    [InlineData(6)]
    public void A_rolling_acceleration_measures_the_scale_from_its_change_of_speed(int seed)
    {
        // 15 m/s for 1.5 s, then 3 m/s² for 5 s: no rest anywhere; the opening speed is a wide prior.
        var motion = new Piecewise(15, [0, 1.5], [0, 3]);
        (double[] grid, double[] dv, double[] dd, PulseChannel pulses) = Record(motion, 6.5, seed, brakeSlip: 0);
        var moving = new MovingWindow(new Estimate(15 / TrueScale, 2.5), [], 0, 0);

        RollingScale fit = RollingScaleFit.Fit(grid, dv, dd, null, pulses, MetresPerPulse, pulses.MidS(0), 6.5, Noise(), moving)!.Value;

        Assert.True(Math.Abs(fit.Scale.Value - TrueScale) <= 3 * fit.Scale.Sigma, $"{fit.Scale} against {TrueScale}");
        Assert.True(fit.Scale.Sigma < 0.005, $"{fit.Scale}");
        Assert.Equal(0, fit.RestEquations);
    }

    [Fact]
    public void A_steady_cruise_alone_says_nothing_of_the_scale()
    {
        // ρ·N·m against v₀·τ: with the opening speed free, no change of speed, no rest, the
        // posterior is the prior.
        var motion = new Piecewise(20, [0], [0]);
        (double[] grid, double[] dv, double[] dd, PulseChannel pulses) = Record(motion, 5, 7, brakeSlip: 0);
        var moving = new MovingWindow(new Estimate(20 / TrueScale, 3), [], 0, 0);

        RollingScale fit = RollingScaleFit.Fit(grid, dv, dd, null, pulses, MetresPerPulse, pulses.MidS(0), 5, Noise(), moving)!.Value;

        Assert.True(fit.Scale.Sigma > 0.0095, $"{fit.Scale}");
    }

    private static RollingScale? FitStop(double[] grid, double[] dv, double[] dd, PulseChannel pulses, double stop)
    {
        double[] rest = [.. Enumerable.Range(0, 14).Select(i => stop + 0.2 + (0.1 * i)).Where(t => t <= stop + 1.5 + 1e-9)];
        var moving = new MovingWindow(new Estimate(25 / TrueScale, 3.5), rest, stop - 3.0, 0);
        return RollingScaleFit.Fit(grid, dv, dd, null, pulses, MetresPerPulse, pulses.MidS(0), 3.0, Noise(), moving);
    }

    private static RollingScaleNoise Noise() => new()
    {
        InputDensity = NoiseMps2 * NoiseMps2 / RateHz,
        BiasWanderDensity = 1e-6,
        BiasSigmaMps2 = 0.02,
        CircumferenceSigma = 0.01,
        GrowthSigma = 1e-6,
        ToothSigmaM = 1e-5,
        EdgeJitterS = 1e-6,
        WindowS = 40,
        TopSpeedMps = double.PositiveInfinity,
    };

    /// <summary>The grid at every sample with the input integrated over each step as the
    /// reconstruction does (linear between samples), and the pulses; under braking the wheel
    /// turns (1 − <paramref name="brakeSlip"/>) times the distance.</summary>
    private static (double[] Grid, double[] StepSpeed, double[] StepDistance, PulseChannel Pulses) Record(Piecewise motion, double endS, int seed, double brakeSlip)
    {
        var random = new Random(seed);
        int n = (int)(endS * RateHz) + 1;
        var grid = new double[n];
        var input = new double[n];
        double half = 0.5 / RateHz;
        for (int i = 0; i < n; i++)
        {
            grid[i] = i / RateHz;
            double gauss = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
            input[i] = ((motion.Speed(grid[i] + half) - motion.Speed(Math.Max(grid[i] - half, 0))) / (grid[i] + half - Math.Max(grid[i] - half, 0))) + (NoiseMps2 * gauss);
        }

        var dv = new double[n];
        var dd = new double[n];
        for (int k = 0; k + 1 < n; k++)
        {
            double h = grid[k + 1] - grid[k];
            dv[k] = 0.5 * (input[k] + input[k + 1]) * h;
            dd[k] = ((2 * input[k]) + input[k + 1]) / 6 * h * h;
        }

        // The wheel's own distance: the car's, less the slip while braking (decelerating).
        double brakeFrom = motion.StartS.Length > 1 ? motion.StartS[1] : double.PositiveInfinity;
        double Wheel(double t) => t <= brakeFrom || brakeSlip == 0 ? motion.Distance(t) : motion.Distance(brakeFrom) + ((1 - brakeSlip) * (motion.Distance(t) - motion.Distance(brakeFrom)));
        var records = new List<PulseRecord>();
        double phase = 0.4 * MetresPerPulse * TrueScale;
        double total = Wheel(endS);
        for (long k = 1; phase + ((k - 1) * MetresPerPulse * TrueScale) < total; k++)
        {
            double target = phase + ((k - 1) * MetresPerPulse * TrueScale);
            double lo = 0;
            double hi = endS;
            for (int i = 0; i < 80; i++)
            {
                double mid = 0.5 * (lo + hi);
                (lo, hi) = Wheel(mid) < target ? (mid, hi) : (lo, mid);
            }

            double t = 0.5 * (lo + hi);
            records.Add(new PulseRecord(k, t - 2e-6, t));
        }

        return (grid, dv, dd, PulseChannel.From(records));
    }

    private static double WhiteKernel(double tau, bool speed, double u) => speed ? 1 : tau - u;

    private static double WalkKernel(double tau, bool speed, double u) => speed ? tau - u : (tau - u) * (tau - u) / 2;

    private static double Simpson(Func<double, double> f, double to)
    {
        const int panels = 64;
        double h = to / panels;
        double sum = f(0) + f(to);
        for (int i = 1; i < panels; i++)
        {
            sum += (i % 2 == 1 ? 4 : 2) * f(i * h);
        }

        return sum * h / 3;
    }

    /// <summary>Stretches of constant acceleration from speed <paramref name="V0"/>.</summary>
    private sealed record Piecewise(double V0, double[] StartS, double[] AccelMps2)
    {
        public double Speed(double t) => Walk(t).Speed;

        public double Distance(double t) => Walk(t).Distance;

        private (double Speed, double Distance) Walk(double t)
        {
            double v = V0;
            double d = 0;
            for (int j = 0; j < StartS.Length && t > StartS[j]; j++)
            {
                double end = j + 1 < StartS.Length ? Math.Min(t, StartS[j + 1]) : t;
                double span = end - StartS[j];
                d += (v * span) + (0.5 * AccelMps2[j] * span * span);
                v += AccelMps2[j] * span;
            }

            return (v, d);
        }
    }

    // Box–Muller (G. E. P. Box, M. E. Muller, 1958).
    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
