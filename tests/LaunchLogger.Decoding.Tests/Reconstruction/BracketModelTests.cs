using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The interval a polled bracket's last edge lies in, checked against brute force: an
/// edge train of fixed period at a random phase, polled at a fixed period, every bracket that saw
/// a rise compared with where its last edge really was. A uniform distribution on an interval of
/// width w has mean at its middle and variance w²/12 (any probability textbook).</summary>
public class BracketModelTests
{
    [Theory]
    [InlineData(0.1e-3, 1.5e-3)]
    [InlineData(1e-3, 1.5e-3)]
    [InlineData(1e-3, 0.7e-3)]
    [InlineData(1e-3, 0.3e-3)]
    [InlineData(3e-3, 1.1e-3)]
    [InlineData(10e-3, 0.41e-3)]
    public void TheIntervalMiddleIsUnbiasedAndItsWidthGivesTheSpread(double pollS, double pulsePeriodS)
    {
        var random = new Random(7);
        double sumError = 0;
        double sumSquare = 0;
        double sumClaimed = 0;
        int n = 0;
        for (int trial = 0; trial < 4000; trial++)
        {
            double phase = random.NextDouble() * pulsePeriodS;
            double lo = random.NextDouble() * 100 * pollS;
            double hi = lo + pollS;
            long before = (long)Math.Floor((lo - phase) / pulsePeriodS);
            long after = (long)Math.Floor((hi - phase) / pulsePeriodS);
            long rise = after - before;
            if (rise < 1)
            {
                continue;
            }

            double lastEdge = phase + (after * pulsePeriodS);
            BracketModel.LastEdge(lo, hi, rise, pulsePeriodS, 0, out double from, out double to);
            Assert.InRange(lastEdge, from - 1e-12, to + 1e-12);
            double error = (0.5 * (from + to)) - lastEdge;
            sumError += error;
            sumSquare += error * error;
            sumClaimed += (to - from) * (to - from) / 12;
            n++;
        }

        double rms = Math.Sqrt(sumSquare / n);
        double claimed = Math.Sqrt(sumClaimed / n);
        // The mean of n uniform errors has σ = rms/√n: four of those is far beyond chance.
        Assert.InRange(sumError / n, -4 * rms / Math.Sqrt(n), 4 * rms / Math.Sqrt(n));
        Assert.InRange(rms / claimed, 0.9, 1.1);
    }

    [Fact]
    public void AnUnknownPulsePeriodLeavesTheWholeBracket()
    {
        BracketModel.LastEdge(1.0, 1.001, 1, double.PositiveInfinity, 0, out double from, out double to);
        Assert.Equal((1.0, 1.001), (from, to));
    }

    [Fact]
    public void AnUncertainPulsePeriodWidensTheIntervalOnBothSides()
    {
        BracketModel.LastEdge(1.0, 1.003, 2, 0.0011, 0, out double exactFrom, out double exactTo);
        BracketModel.LastEdge(1.0, 1.003, 2, 0.0011, 0.1, out double from, out double to);
        Assert.True(from < exactFrom && to > exactTo, $"({from}, {to}) should contain ({exactFrom}, {exactTo}) with room on both sides");
    }
}
