using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The tyre's scale drawn from the measured ratio of the pulses' scale to the
/// accelerometer's (<see cref="RollingScaleMeasure.CombineScales"/>), checked by Monte Carlo: the
/// truth is drawn here (the tyre's scale ρ and the accelerometer's error s from their priors, the
/// ratio ρ·(1 + s) exactly as the two sensors give it, read with a Gaussian error), and the spread
/// of the combination's errors is measured over the draws, not asked of our code. What it checks:
/// that the σ our code claims is the spread its estimate actually has (so ±2σ holds 95 %), that
/// its errors have no bias, and that the spread is the closed form's, σ_c·σ_s / √(σ_c² + σ_s²)
/// for a ratio read exactly (σ/√2 for two priors of 1 %; the product of two Gaussians, C. M.
/// Bishop, "Pattern Recognition and Machine Learning", 2006, §2.3.3) — below what keeping the
/// tyre's prior alone leaves, which the same draws measure.</summary>
public class ScaleCombinationTests
{
    private const int Draws = 40000;

    [Theory]
    [InlineData(0.01, 0.01, 0)]
    [InlineData(0.01, 0.01, 0.003)]
    [InlineData(0.01, 0.002, 0.001)]
    [InlineData(0.005, 0.01, 0.002)]
    public void The_combined_scale_has_the_spread_its_sigma_claims_and_beats_the_tyres_prior_alone(double tyreSigma, double accelSigma, double readSigma)
    {
        var random = new Random(20261205);
        double ratioPrior = Math.Sqrt((tyreSigma * tyreSigma) + (accelSigma * accelSigma));
        double sum = 0;
        double sumSquares = 0;
        double priorSquares = 0;
        double claimed = 0;
        int within2 = 0;
        for (int i = 0; i < Draws; i++)
        {
            double rho = 1 + (tyreSigma * SyntheticRun.Gaussian(random));
            double s = accelSigma * SyntheticRun.Gaussian(random);
            double read = (rho * (1 + s)) + (readSigma * SyntheticRun.Gaussian(random));

            // What the fit gives for the ratio: a Gaussian prior N(1, σ_c² + σ_s²) updated by one
            // reading of it with σ_read (the conjugate update of a Gaussian mean; Bishop §2.3.6).
            double information = (1 / (ratioPrior * ratioPrior)) + (readSigma > 0 ? 1 / (readSigma * readSigma) : double.PositiveInfinity);
            double ratioValue = readSigma > 0 ? ((1 / (ratioPrior * ratioPrior)) + (read / (readSigma * readSigma))) / information : read;
            double ratioSigma = readSigma > 0 ? Math.Sqrt(1 / information) : 0;
            var ratio = new RollingScale(new Estimate(ratioValue, ratioSigma), 0, 0, 1);

            Estimate combined = RollingScaleMeasure.CombineScales(ratio, tyreSigma, accelSigma).Scale;
            double error = combined.Value - rho;
            sum += error;
            sumSquares += error * error;
            priorSquares += (1 - rho) * (1 - rho);
            claimed = combined.Sigma;
            within2 += Math.Abs(error) <= 2 * combined.Sigma ? 1 : 0;
        }

        double mean = sum / Draws;
        double spread = Math.Sqrt((sumSquares / Draws) - (mean * mean));
        double priorSpread = Math.Sqrt(priorSquares / Draws);

        // The sample SD of 40,000 normal draws is within 1.6 % of the true one at 4.5 of its
        // σ (its relative σ is 1/√(2n) = 0.35 %); the mean within 4.5·σ/√n.
        Assert.InRange(mean, -4.5 * spread / Math.Sqrt(Draws), 4.5 * spread / Math.Sqrt(Draws));
        Assert.InRange(claimed / spread, 0.984, 1.016);

        // ±2σ of a normal error holds 95.45 %; binomial σ over 40,000 draws is 0.1 %.
        Assert.InRange(within2 / (double)Draws, 0.950, 0.959);

        // A ratio read exactly: the closed form; σ/√2 for two priors of 1 %.
        double floor = tyreSigma * accelSigma / Math.Sqrt((tyreSigma * tyreSigma) + (accelSigma * accelSigma));
        if (readSigma == 0)
        {
            Assert.Equal(floor, claimed, 1e-9);
            if (tyreSigma == accelSigma)
            {
                Assert.Equal(tyreSigma / Math.Sqrt(2), claimed, 1e-9);
            }
        }
        else
        {
            Assert.True(claimed > floor);
        }

        // Keeping the tyre's prior alone leaves its own spread; the combination does better.
        Assert.InRange(priorSpread / tyreSigma, 0.984, 1.016);
        Assert.True(spread < 0.98 * priorSpread, FormattableString.Invariant($"combined {spread:0.00000} against the prior's {priorSpread:0.00000}"));
    }

    [Fact]
    public void A_ratio_read_no_better_than_its_prior_leaves_the_tyres_prior_as_it_was()
    {
        // No data: the ratio's posterior is its prior, N(1, σ_c² + σ_s²); the tyre's scale must
        // come back as its own prior, N(1, σ_c²) (marginalising a Gaussian; Bishop §2.3.2).
        const double Tyre = 0.01;
        const double Accel = 0.01;
        var ratio = new RollingScale(new Estimate(1, Math.Sqrt((Tyre * Tyre) + (Accel * Accel))), 0, 0, 1);

        Estimate combined = RollingScaleMeasure.CombineScales(ratio, Tyre, Accel).Scale;

        Assert.Equal(1, combined.Value, 12);
        Assert.Equal(Tyre, combined.Sigma, 12);
    }
}
