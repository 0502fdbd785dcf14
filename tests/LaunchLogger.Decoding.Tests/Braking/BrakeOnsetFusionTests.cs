using LaunchLogger.Decoding.Braking;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>The switch's window and the deceleration's onset combined: with sharp edges the
/// product of two uniform windows is uniform on their overlap, whose mean and σ are the
/// textbook (a + b)/2 and (b − a)/√12; a seeded Monte Carlo of the readings checks the moments
/// where the edges are not sharp.</summary>
public class BrakeOnsetFusionTests
{
    private const double Span = BrakeSwitchTiming.DelaySpanS;
    private const double Lag = 1e-4; // the loop lag's σ: an edge a tenth of a millisecond wide

    /// <summary>The switch's onset as <see cref="BrakeSwitchTiming.Onset"/> gives it for a
    /// window [latest − span, latest].</summary>
    private static Estimate SwitchWindowEndingAt(double latestS) =>
        new(latestS - (Span / 2), Math.Sqrt((Lag * Lag) + (Span * Span / 12)));

    /// <summary>A sharp deceleration (σ 0.1 ms) against the switch's window [10.000, 10.030] s: the
    /// pedal moved in [decel − τ_max, decel] by the one and inside the window by the other, so
    /// uniform on the overlap. At 10.012 s that is the dead time's whole window; at 10.032 s, past
    /// the switch's latest edge, it is cut there.</summary>
    [Theory]
    [InlineData(10.012)]
    [InlineData(10.032)]
    public void A_sharp_deceleration_leaves_the_overlap_of_the_two_windows(double decelS)
    {
        Estimate both = BrakeOnsetFusion.Combine(SwitchWindowEndingAt(10.030), Span, new Estimate(decelS, 1e-4))!.Value;
        double low = Math.Max(decelS - BrakeOnsetFusion.DeadTimeHighS, 10.000), high = Math.Min(decelS, 10.030);
        Assert.Equal((low + high) / 2, both.Value, 4);
        Assert.Equal((high - low) / Math.Sqrt(12), both.Sigma, 4);
        Assert.True(both.Value <= 10.030);
    }

    [Fact]
    public void A_vague_deceleration_leaves_the_switch_s_window()
    {
        // σ 1 s: flat over the 30 ms window, which is then uniform: mean at its centre, σ span/√12.
        Estimate both = BrakeOnsetFusion.Combine(SwitchWindowEndingAt(10.030), Span, new Estimate(10.015, 1.0))!.Value;
        Assert.Equal(10.015, both.Value, 4);
        Assert.Equal(Span / Math.Sqrt(12), both.Sigma, 4);
    }

    [Fact]
    public void Windows_far_apart_do_not_combine()
    {
        // 100 ms after the switch's latest edge, with σ 5 ms: 20σ off, another event.
        Assert.Null(BrakeOnsetFusion.Combine(SwitchWindowEndingAt(10.030), Span, new Estimate(10.130, 0.005)));
        Assert.Null(BrakeOnsetFusion.Combine(SwitchWindowEndingAt(10.030), Span, new Estimate(9.900, 0.005)));

        // A measured delay leaves no window to combine in.
        Assert.Null(BrakeOnsetFusion.Combine(new Estimate(10.015, 0.001), 0, new Estimate(10.015, 0.005)));
    }

    [Fact]
    public void Blurred_windows_match_a_monte_carlo_of_their_product()
    {
        // The switch alone, with a flat prior, puts the pedal at the reading less a delay drawn
        // uniform over the span and a lag drawn Gaussian; of those draws, keep the ones whose
        // deceleration (the pedal, a dead time drawn uniform, the fit's Gaussian error) comes
        // within a hair of the fitted onset. The kept draws' mean and σ are the product's.
        const double reading = 10.030, lagSigma = 0.002, fitted = 10.020, fitSigma = 0.004;
        Estimate switchOnset = new(reading - (Span / 2), Math.Sqrt((lagSigma * lagSigma) + (Span * Span / 12)));
        Estimate both = BrakeOnsetFusion.Combine(switchOnset, Span, new Estimate(fitted, fitSigma))!.Value;

        var random = new Random(20261205);
        double sum = 0, sumSquares = 0;
        int kept = 0;
        const double tolerance = 0.0002;
        for (int i = 0; i < 2_000_000 && kept < 20_000; i++)
        {
            double p = reading - (Span * random.NextDouble()) - (lagSigma * Gaussian(random));
            double decel = p + (BrakeOnsetFusion.DeadTimeHighS * random.NextDouble()) + (fitSigma * Gaussian(random));
            if (Math.Abs(decel - fitted) < tolerance)
            {
                sum += p;
                sumSquares += p * p;
                kept++;
            }
        }

        double mean = sum / kept;
        double sigma = Math.Sqrt((sumSquares / kept) - (mean * mean));
        Assert.Equal(20_000, kept);
        Assert.InRange(both.Value - mean, -0.0003, 0.0003);
        Assert.InRange(both.Sigma, 0.95 * sigma, 1.05 * sigma);
    }

    // Box–Muller (G. E. P. Box, M. E. Muller, 1958).
    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
