using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The lagged ramp's evidence against the plain ramp, 2·ln Λ = (RSS_ramp − RSS_lagged)/σ²
/// (<see cref="AccelOnset.LagStatistic"/>), where its lag is the best of a scan over four octaves.
/// The best of a scan can overstate its evidence (R. B. Davies 1987, "Hypothesis testing when a
/// nuisance parameter is present only under the alternative", Biometrika 74(1)); these tests
/// measure the statistic's null distribution on straight ramps instead of assuming it. Under the
/// null the straight ramps are the independent generator's standing starts
/// (<see cref="PrescribedShapes.StandingStart"/>: peak 0.25–1.1 g, ramp 0.05–0.4 s, then the pull),
/// their acceleration exact from its motion profile, sampled at the bench's five rates with white
/// noise of 100–300 µg/√Hz over the Nyquist band as the generator's sensor draws it, the onset
/// anywhere within a sample. The reference is one regular extra parameter, whose 2·ln Λ is χ²
/// with one degree of freedom (S. S. Wilks 1938, "The large-sample distribution of the likelihood
/// ratio for testing composite hypotheses", Ann. Math. Statist. 9(1)); its upper 5 % point is
/// 3.841 (any table of χ², e.g. M. Abramowitz and I. A. Stegun 1964, "Handbook of Mathematical
/// Functions", ch. 26 — from memory).</summary>
public class LagScanNullTests
{
    private const double Gravity = 9.80665;

    /// <summary>χ²₁'s upper 5 % point (the summary's table).</summary>
    private const double ChiSquareOneDof95 = 3.841;

    [Fact]
    public void On_straight_ramps_the_scanned_lag_beats_the_ramp_less_often_than_one_free_parameter_would()
    {
        // The shortest lag scanned is 10 ms, several samples at every rate: the lagged ramp cannot
        // become the straight one, its τ² foot misfits the ramp's corner, and the scan's best lag
        // mostly fits worse than the ramp (2·ln Λ < 0). Measured with 400 ramps a rate (seed
        // 12345): 2·ln Λ ≥ 2 in 1.7 % and ≥ 3.841 in 0.75 % of 2,000, largest 7.0; through the whole
        // bench (seeds 11–14, 320 standing starts) 1.9 % and 0.6 %, largest 5.3. A lag's odds
        // exp(−ΔBIC/2) therefore do not overstate it on straight ramps; one regular parameter would
        // pass 3.841 in 5 %.
        var random = new Random(20261205);
        var statistics = new List<double>();
        foreach (double rateHz in new[] { 100.0, 200, 400, 800, 1600 })
        {
            for (int k = 0; k < 40; k++)
            {
                var profile = PrescribedShapes.StandingStart(new Random(random.Next())).Profile;
                double noise = (100 + (200 * random.NextDouble())) * 1e-6 * Gravity * Math.Sqrt(rateHz / 2);
                statistics.Add(Statistic(rateHz, noise, 0.05, tau => profile.StateAt(PrescribedShapes.IdleS + tau).AccelMps2, random));
            }
        }

        int beyond = statistics.Count(d => d >= ChiSquareOneDof95);
        int positive = statistics.Count(d => d > 0);

        // One regular parameter: 5 % beyond 3.841, half above 0 (Wilks). Asked: under 2.5 %
        // beyond 3.841 (5 of 200; χ²₁ would give 10 ± 3) and under a quarter above 0.
        Assert.True(beyond <= 5, $"{beyond} of {statistics.Count} beyond χ²₁'s 5 % point");
        Assert.True(positive < statistics.Count / 4, $"{positive} of {statistics.Count} favour the lag at all");
    }

    [Theory]
    [InlineData(100, 0.25, 0.05)]
    [InlineData(400, 0.25, 0.03)]
    [InlineData(1600, 0.30, 0.04)]
    [InlineData(400, 0.15, 0.1)]
    public void On_a_lagged_take_up_the_statistic_is_far_beyond_the_null(double rateHz, double riseS, double lagS)
    {
        // The same statistic with a lag of 30–100 ms (the closed form of LaggedTakeUpOnsetTests,
        // 150 µg/√Hz): it tells a lag from a straight ramp; asked beyond 3.841 in 95 % of 100.
        var random = new Random((int)(rateHz + (1000 * riseS) + (1e4 * lagS)));
        double noise = 150e-6 * Gravity * Math.Sqrt(rateHz / 2.0);
        int beyond = 0;
        const int trials = 100;
        for (int trial = 0; trial < trials; trial++)
        {
            double peak = Gravity * (0.25 + (0.85 * random.NextDouble()));
            beyond += Statistic(rateHz, noise, riseS, tau => LaggedTakeUpOnsetTests.Lagged(tau, peak, riseS, lagS), random) >= ChiSquareOneDof95 ? 1 : 0;
        }

        Assert.True(beyond >= 0.95 * trials, $"{beyond} of {trials} beyond χ²₁'s 5 % point");
    }

    /// <summary>The statistic found on <paramref name="rise"/> after a rest at a drawn level, the
    /// onset anywhere within a sample after 2 s, the search ending <paramref name="searchAfterS"/>
    /// after it.</summary>
    private static double Statistic(double rateHz, double noise, double searchAfterS, Func<double, double> rise, Random random)
    {
        double onsetS = 2.0 + (random.NextDouble() / rateHz);
        double level = 0.1 + (0.4 * random.NextDouble());
        (double[] t, double[] reading) = AccelOnsetFitTests.Sampled(rateHz, 3, onsetS, level, noise, rise, random);
        int to = (int)Math.Ceiling((onsetS + searchAfterS) * rateHz);
        AccelOnset? found = AccelOnsetFit.Find(t, reading, level, noise, 1, 1 / rateHz, 0, to, lastRise: true);
        Assert.NotNull(found);
        return found.Value.LagStatistic;
    }
}
