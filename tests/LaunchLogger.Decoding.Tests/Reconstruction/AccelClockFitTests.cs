using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The accelerometer's clock offset against the pulses', on a launch written from closed
/// forms: after a rest the car accelerates at 4 m/s² for 2 s, 0.5 m/s² for 0.3 s (a gear change)
/// and 3 m/s² after, each stretch covering v₀·τ + a·τ²/2 (constant acceleration, any kinematics
/// text); every edge of a ring with 50 mm per pulse is placed where that distance passes a tooth
/// (bisection), and the accelerometer is sampled on its own axis, which stands δ from the pulses'
/// (its time = pulse time + δ), with white noise and a bias. A single constant acceleration would
/// not do: a shifted parabola is another parabola, so with the scale and bias free the offset
/// cannot be told from them (the fit says so with a σ of some 17 ms).</summary>
public class AccelClockFitTests
{
    private const double AccelMps2 = 4;
    private const double StartS = 1.0;
    private const double MetresPerPulse = 0.05;
    private const double RateHz = 500;
    private const double NoiseMps2 = 0.05;

    [Theory]
    [InlineData(-6e-3, 1)]
    [InlineData(-6e-3, 2)]
    [InlineData(0, 3)]
    [InlineData(4e-3, 4)]
    [InlineData(4e-3, 5)]
    [InlineData(1.5e-3, 6)]
    public void The_offset_is_found_within_three_sigma_and_to_a_millisecond(double offsetS, int seed)
    {
        (double[] time, double[] input, PulseChannel pulses) = Launch(offsetS, seed, biasMps2: 0.03);
        double density = NoiseMps2 * NoiseMps2 / RateHz;

        Estimate? fit = AccelClockFit.Fit(time, input, StartS + offsetS - 0.3, StartS + offsetS, StartS + 5, pulses, MetresPerPulse, 1e-4, density, 58e-6, new Estimate(0, 0));

        Assert.NotNull(fit);
        Estimate f = fit.Value;
        Assert.True(Math.Abs(f.Value - offsetS) <= 3 * f.Sigma, $"δ {f.Value * 1e3:F3} ms ± {f.Sigma * 1e3:F3}, truth {offsetS * 1e3:F3}");
        Assert.True(f.Sigma < 1e-3, $"σ {f.Sigma * 1e3:F3} ms");
    }

    [Theory]
    [InlineData(-6e-3, 7)]
    [InlineData(5e-3, 8)]
    public void An_uncalibrated_tyre_that_grows_with_speed_does_not_move_the_offset(double offsetS, int seed)
    {
        // The pulses count a circumference 1.5 % short and a tyre growing by 0.4 % at 30 m/s
        // (with the square of speed): counted = (1 + s)·(d + G·∫(v/30)²·v dt), v³ integrated in
        // closed form over each constant-acceleration stretch, ((v₀ + aτ)⁴ − v₀⁴)/(4a).
        (double[] time, double[] input, PulseChannel pulses) = Launch(offsetS, seed, biasMps2: 0.02, scale: -0.015, growthAt30Mps: 0.004);

        Estimate? fit = AccelClockFit.Fit(time, input, StartS + offsetS - 0.3, StartS + offsetS, StartS + 6, pulses, MetresPerPulse, 1e-4, NoiseMps2 * NoiseMps2 / RateHz, 58e-6, new Estimate(0, 0));

        Assert.NotNull(fit);
        Estimate f = fit.Value;
        Assert.True(Math.Abs(f.Value - offsetS) <= 3 * f.Sigma, $"δ {f.Value * 1e3:F3} ms ± {f.Sigma * 1e3:F3}, truth {offsetS * 1e3:F3}");
        Assert.True(f.Sigma < 1e-3, $"σ {f.Sigma * 1e3:F3} ms");
    }

    [Theory]
    [InlineData(-5e-3, 9)]
    [InlineData(3e-3, 10)]
    [InlineData(6e-3, 11)]
    public void A_noise_density_told_far_too_high_is_brought_down_by_the_residuals(double offsetS, int seed)
    {
        // The input's true density is NoiseMps2²/rate (white samples integrated: a random walk of
        // speed); told 100 times that, with the true one as the measured part, the fit chooses
        // the density by the residuals' restricted likelihood and is as sharp as one told the
        // truth (within the 4× steps it tries: σ within a factor √2 of the true density's fit);
        // without the measured part it keeps the density told, and its σ is several times wider.
        (double[] time, double[] input, PulseChannel pulses) = Launch(offsetS, seed, biasMps2: 0.03);
        double density = NoiseMps2 * NoiseMps2 / RateHz;
        Estimate Fit(double told, double? measured) =>
            AccelClockFit.Fit(time, input, StartS + offsetS - 0.3, StartS + offsetS, StartS + 5, pulses, MetresPerPulse, 1e-4, told, 58e-6, new Estimate(0, 0), measured) ?? throw new InvalidOperationException("no fit");

        Estimate truth = Fit(density, null);
        Estimate chosen = Fit(100 * density, density);
        Estimate kept = Fit(100 * density, null);

        Assert.True(Math.Abs(chosen.Value - offsetS) <= 3 * chosen.Sigma, $"δ {chosen.Value * 1e3:F3} ms ± {chosen.Sigma * 1e3:F3}, truth {offsetS * 1e3:F3}");
        Assert.True(chosen.Sigma <= Math.Sqrt(2) * truth.Sigma, $"σ {chosen.Sigma * 1e3:F3} ms where the true density gives {truth.Sigma * 1e3:F3}");
        Assert.True(kept.Sigma >= 3 * truth.Sigma, $"σ kept {kept.Sigma * 1e3:F3} ms, true density {truth.Sigma * 1e3:F3}");
    }

    [Fact]
    public void Too_few_pulses_in_the_window_give_no_estimate()
    {
        (double[] time, double[] input, PulseChannel pulses) = Launch(0, 1, biasMps2: 0);

        // In its first 0.2 s the car covers a·τ²/2 = 0.08 m: two teeth.
        Assert.Null(AccelClockFit.Fit(time, input, StartS - 0.3, StartS, StartS + 0.2, pulses, MetresPerPulse, 1e-4, 1e-5, 58e-6, new Estimate(0, 0)));
    }

    private static readonly double[] SegmentStartS = [0, 2.0, 2.3];
    private static readonly double[] SegmentAccelMps2 = [AccelMps2, 0.5, 3.0];

    private static double Speed(double tau)
    {
        double v = 0;
        for (int j = 0; j < SegmentStartS.Length && tau > SegmentStartS[j]; j++)
        {
            double end = j + 1 < SegmentStartS.Length ? Math.Min(tau, SegmentStartS[j + 1]) : tau;
            v += SegmentAccelMps2[j] * (end - SegmentStartS[j]);
        }

        return v;
    }

    private static double Distance(double tau)
    {
        double v = 0;
        double d = 0;
        for (int j = 0; j < SegmentStartS.Length && tau > SegmentStartS[j]; j++)
        {
            double end = j + 1 < SegmentStartS.Length ? Math.Min(tau, SegmentStartS[j + 1]) : tau;
            double span = end - SegmentStartS[j];
            d += (v * span) + (0.5 * SegmentAccelMps2[j] * span * span);
            v += SegmentAccelMps2[j] * span;
        }

        return d;
    }

    private static double CubeIntegral(double tau)
    {
        double v = 0;
        double sum = 0;
        for (int j = 0; j < SegmentStartS.Length && tau > SegmentStartS[j]; j++)
        {
            double end = j + 1 < SegmentStartS.Length ? Math.Min(tau, SegmentStartS[j + 1]) : tau;
            double a = SegmentAccelMps2[j];
            double v1 = v + (a * (end - SegmentStartS[j]));
            sum += ((v1 * v1 * v1 * v1) - (v * v * v * v)) / (4 * a);
            v = v1;
        }

        return sum;
    }

    private static double TimeAt(double distance, double scale, double growthAt30Mps)
    {
        double lo = 0;
        double hi = 10;
        for (int i = 0; i < 100; i++)
        {
            double mid = 0.5 * (lo + hi);
            if ((1 + scale) * (Distance(mid) + (growthAt30Mps / 900 * CubeIntegral(mid))) < distance)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        return 0.5 * (lo + hi);
    }

    private static (double[] Time, double[] Input, PulseChannel Pulses) Launch(double offsetS, int seed, double biasMps2, double scale = 0, double growthAt30Mps = 0)
    {
        var random = new Random(seed);
        int n = (int)(7 * RateHz);
        var time = new double[n];
        var input = new double[n];
        for (int i = 0; i < n; i++)
        {
            time[i] = i / RateHz;
            double trueS = time[i] - offsetS;
            double gauss = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
            // The mean acceleration over the sample's period (what a sensor filtered to its rate
            // reports), from the closed-form speed: a step between samples then falls where it was.
            double half = 0.5 / RateHz;
            double mean = (Speed(trueS - StartS + half) - Speed(trueS - StartS - half)) * RateHz;
            input[i] = mean + biasMps2 + (NoiseMps2 * gauss);
        }

        double phase = 0.3 * MetresPerPulse;
        var records = new List<PulseRecord>();
        for (long k = 1; ; k++)
        {
            double distance = ((k - 1) * MetresPerPulse) + phase;
            double t = StartS + TimeAt(distance, scale, growthAt30Mps);
            if (t > StartS + 6)
            {
                break;
            }

            records.Add(new PulseRecord(k, t - 1e-6, t));
        }

        return (time, input, PulseChannel.From(records));
    }
}
