using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Calibration;

public class ToothSpacingCalibrationTests
{
    private const int Teeth = 48;
    private const double Circumference = 1.96;

    /// <summary>Tooth edges at (k + e_k)/n of a revolution, e_k drawn with 1-σ 1 % of a pitch.</summary>
    internal static double[] Ring(int seed, double sigma = 0.01, int teeth = Teeth)
    {
        var random = new Random(seed);
        var positions = new double[teeth];
        for (int k = 0; k < teeth; k++)
        {
            double u1 = 1.0 - random.NextDouble();
            double u2 = random.NextDouble();
            double error = sigma * Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
            positions[k] = (k + Math.Clamp(error, -0.2, 0.2)) / teeth;
        }

        positions[0] = Math.Max(positions[0], 0);
        return positions;
    }

    /// <summary>The true relative length of the gap that ends at edge k: n·(p_k − p_{k−1}).</summary>
    private static double TrueGap(double[] positions, int k)
    {
        int n = positions.Length;
        double previous = k == 0 ? positions[n - 1] - 1 : positions[k - 1];
        return n * (positions[k] - previous);
    }

    [Theory]
    [InlineData("steady 8 m/s, origin 0", 8.0, 0.0, 0L)]
    [InlineData("coasting down from 10 m/s", 10.0, -0.12, 0L)]
    [InlineData("origin count not a whole number of revolutions", 8.0, 0.0, 1_000_003L)]
    public void ExactEdgesRecoverTheRing(string name, double speedMps, double accelMps2, long origin)
    {
        _ = name;
        double[] ring = Ring(seed: 7);
        DecodedRun run = CalibrationRuns.Cruise(ring, Circumference, speedMps, durationS: 30, originCount: origin, accelMps2: accelMps2, jitterS: 5e-6);

        ToothSpacingMap map = ToothSpacingCalibration.Measure(run, origin);

        Assert.True(map.IndexedByHardwareCount);
        Assert.Equal(Teeth, map.Spacing.Count);
        Assert.Equal(1.0, map.Spacing.Average(), 12);
        Assert.True(map.Revolutions >= 100, $"{map.Revolutions} revolutions");
        Assert.Empty(map.Warnings);
        for (int k = 0; k < Teeth; k++)
        {
            // Gap k ends at the edge reached when the hardware count is ≡ k (mod n).
            double truth = TrueGap(ring, k);
            Assert.True(Math.Abs(map.Spacing[k] - truth) <= Math.Max(5 * map.Sigma[k], 2e-5), $"tooth {k}: {map.Spacing[k]:F6} against {truth:F6} ± {map.Sigma[k]:E2}");
        }

        Assert.True(map.RmsDeviation > 0.005, "the ring's errors must show");
    }

    [Fact]
    public void WithoutTheOriginCountTeethAreNumberedFromTheRunsOwnCount()
    {
        double[] ring = Ring(seed: 3);
        const long Origin = 1_000_005;
        DecodedRun run = CalibrationRuns.Cruise(ring, Circumference, 8, 30, originCount: Origin);

        ToothSpacingMap byHardware = ToothSpacingCalibration.Measure(run, Origin);
        ToothSpacingMap byRun = ToothSpacingCalibration.Measure(run, null);

        Assert.False(byRun.IndexedByHardwareCount);
        Assert.Contains(byRun.Warnings, w => w.Contains("own origin", StringComparison.Ordinal));
        for (int k = 0; k < Teeth; k++)
        {
            Assert.Equal(byHardware.Spacing[(int)((k + Origin) % Teeth)], byRun.Spacing[k], 12);
        }
    }

    [Fact]
    public void PolledBracketsTooWideForTheSpeedAreRefused()
    {
        // 0.5 ms brackets at 8 m/s: a 40.8 mm tooth takes 5.1 ms, so one interval is uncertain by
        // 0.5/√6/5.1 ≈ 4 % and 120 revolutions leave about 0.36 % per tooth.
        DecodedRun run = CalibrationRuns.Cruise(Ring(seed: 1), Circumference, 8, 30, bracketS: 5e-4);

        var e = Assert.Throws<CalibrationException>(() => ToothSpacingCalibration.Measure(run, 0));

        Assert.Contains("brackets", e.Message, StringComparison.Ordinal);
        Assert.Contains("cruise slower or longer", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void PolledBracketsAtASlowCruiseGiveAMapWithAWarningAndHonestSigmas()
    {
        // 0.25 ms brackets at 6 m/s: 1.5 % per interval, about 0.1 % per tooth after 180 revolutions.
        double[] ring = Ring(seed: 5);
        DecodedRun run = CalibrationRuns.Cruise(ring, Circumference, 6, 60, bracketS: 2.5e-4);

        ToothSpacingMap map = ToothSpacingCalibration.Measure(run, 0);

        Assert.Contains(map.Warnings, w => w.Contains("polled counter", StringComparison.Ordinal));
        Assert.InRange(map.BracketNoiseFraction, 0.01, 0.02);
        double chiSquare = Enumerable.Range(0, Teeth).Sum(k => Math.Pow((map.Spacing[k] - TrueGap(ring, k)) / map.Sigma[k], 2));
        Assert.InRange(chiSquare / Teeth, 0.3, 2.5);
    }

    [Fact]
    public void TooFewSteadyRevolutionsAreRefused()
    {
        DecodedRun run = CalibrationRuns.Cruise(Ring(seed: 1), Circumference, 8, 3);

        var e = Assert.Throws<CalibrationException>(() => ToothSpacingCalibration.Measure(run, 0));

        Assert.Contains("steady revolutions", e.Message, StringComparison.Ordinal);
    }

    /// <summary>Also on a ring ten times finer than a cut one (0.1 % of a pitch): the halves'
    /// comparison has a floor (<see cref="ToothSpacingCalibration.HalfMapFloor"/>) for what the
    /// speed's change leaves in a map, well under what a slipped numbering moves.</summary>
    [Theory]
    [InlineData(0.01)]
    [InlineData(0.001)]
    public void ADoubledEdgeHalfWayShowsAsHalvesThatDisagree(double toothSigma)
    {
        DecodedRun run = CalibrationRuns.Cruise(Ring(seed: 2, toothSigma), Circumference, 8, 30, doubledAtCount: 3000);

        ToothSpacingMap map = ToothSpacingCalibration.Measure(run, 0);

        Assert.Contains(map.Warnings, w => w.Contains("lost or doubled", StringComparison.Ordinal));
    }
}
