using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Runs.Support;
using LaunchLogger.Firmware.Run;
using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.LinearRegression;

namespace LaunchLogger.Decoding.Tests.Runs;

public class SampleClockTests
{
    [Fact]
    public void DriftedRateIsRecoveredThroughTheWholeChain()
    {
        // Nominal 1000 Hz, true 1000.3 Hz (300 ppm fast), bursts of 20 read 0–2 ms late.
        var driver = new LaunchDriver(new LoggerSettings()) { TrueRateHz = 1000.3, MaxReadLatencyMicros = 2000, Seed = 42 };
        driver.Run(accelerateUntilMicros: 8_000_000, endMicros: 12_000_000);

        AccelSeries accel = LogReader.Read(driver.Sink.ToArray(), "drift.log").Runs.Single().Accel!;

        // Tolerance: least squares of read time on index has slope standard error
        // σ_P = σ_r / √Σ(i − ī)²; latency uniform over 2 ms gives σ_r = 2 ms/√12 ≈ 0.58 ms, and
        // about 480 bursts 20 samples apart give √Σ(i − ī)² = 20·√(N(N²−1)/12) ≈ 6.7e4, so
        // σ_P ≈ 9 ns, 9 ppm of the period. The estimate must lie within 4 σ of the truth, the
        // reported σ must be of that size, and the nominal period must be far outside.
        double truePeriod = 1 / 1000.3;
        double sigma = accel.SamplePeriodUncertaintyS;
        Assert.InRange(sigma, 4e-9, 2e-8);
        Assert.True(Math.Abs(accel.SamplePeriodS - truePeriod) < 4 * sigma, $"period {accel.SamplePeriodS:E6} vs {truePeriod:E6}, σ {sigma:E2}");
        Assert.True(Math.Abs(1e-3 - accel.SamplePeriodS) > 20 * sigma);

        // Sample times: reads lag by 1 ms on average, and the lower envelope removes that. What
        // is left at the ends of the run is the period's error times the distance from the
        // middle: about 5000 samples · 9 ns ≈ 45 µs per σ, so 4 σ ≈ 0.2 ms at worst.
        double[] errors = accel.TimeS.Select((t, i) => t - driver.FedSamples[accel.SampleIndex![i]].TrueS).ToArray();
        Assert.True(Math.Abs(errors.Average()) < 0.05e-3, $"mean time error {errors.Average() * 1e3:F3} ms");
        Assert.True(errors.Max(Math.Abs) < 0.2e-3, $"worst time error {errors.Max(Math.Abs) * 1e3:F3} ms");
    }

    [Fact]
    public void SingleSegmentSlopeMatchesMathNetFitLine()
    {
        List<BurstReading> bursts = Synthetic(periodS: 0.99994e-3, count: 300, latencyS: 1.5e-3, seed: 3);

        SampleClock clock = SampleClock.Fit(bursts, 1e-3);

        // Reference library: MathNet.Numerics Fit.Line (ordinary least squares, y = a + b·x).
        (double _, double slope) = Fit.Line(bursts.Select(b => (double)b.LastIndex).ToArray(), bursts.Select(b => b.ReadS).ToArray());
        Assert.Equal(slope, clock.PeriodS, slope * 1e-12);
        Assert.True(clock.Estimated);
        Assert.Equal(0, clock.BurstsRejected);
    }

    [Fact]
    public void SegmentsShareTheSlopeAsMathNetRegressionWithOneInterceptEach()
    {
        List<BurstReading> bursts = Synthetic(periodS: 1.0002e-3, count: 200, latencyS: 1e-3, seed: 5);
        bursts = bursts.Select((b, k) => k < 120 ? b : b with { LastIndex = b.LastIndex + 17, Segment = 1 }).ToList();

        SampleClock clock = SampleClock.Fit(bursts, 1e-3);

        // Reference library: MathNet.Numerics MultipleRegression.QR on columns
        // [index, segment 0 indicator, segment 1 indicator].
        Matrix<double> x = Matrix<double>.Build.Dense(bursts.Count, 3, (row, col) => col == 0 ? bursts[row].LastIndex : (bursts[row].Segment == col - 1 ? 1 : 0));
        Vector<double> y = Vector<double>.Build.Dense(bursts.Select(b => b.ReadS).ToArray());
        Vector<double> beta = MultipleRegression.QR(x, y);
        Assert.Equal(beta[0], clock.PeriodS, beta[0] * 1e-9);
        Assert.Equal(2, clock.SegmentCount);
    }

    [Fact]
    public void LateOutliersAreDroppedAndDoNotBendTheSlope()
    {
        List<BurstReading> clean = Synthetic(periodS: 1e-3, count: 400, latencyS: 0.5e-3, seed: 9);
        List<BurstReading> stalled = clean.Select((b, k) => k % 50 == 7 ? b with { ReadS = b.ReadS + 0.040 } : b).ToList();

        SampleClock reference = SampleClock.Fit(clean, 1e-3);
        SampleClock clock = SampleClock.Fit(stalled, 1e-3);

        Assert.Equal(8, clock.BurstsRejected);
        Assert.Equal(reference.PeriodS, clock.PeriodS, 5 * reference.PeriodSigmaS);
        Assert.Equal(reference.TimeOf(5000, 0), clock.TimeOf(5000, 0), 1e-5);
    }

    [Fact]
    public void LowerEnvelopeRemovesTheMeanReadLatency()
    {
        // Latency uniform on [0, 4 ms]: a plain fit's times would be 2 ms late.
        List<BurstReading> bursts = Synthetic(periodS: 1e-3, count: 500, latencyS: 4e-3, seed: 11);

        SampleClock clock = SampleClock.Fit(bursts, 1e-3);

        // The mean of 500 uniform latencies has σ = 4 ms/√12/√500 ≈ 0.05 ms.
        Assert.Equal(2e-3, clock.MeanReadLatencyS, 0.2e-3);

        // Left: the smallest of 500 latencies (≈ 4 ms/500 = 8 µs) plus the period's error times
        // the distance from the middle of the bursts (index 5000), allowed up to 4 σ.
        for (long i = 0; i < 10_000; i += 997)
        {
            double allowed = 0.03e-3 + (4 * clock.PeriodSigmaS * Math.Abs(i - 5000));
            Assert.Equal(StartS + (i * 1e-3), clock.TimeOf(i, 0), allowed);
        }
    }

    [Fact]
    public void ManySegmentsInAnyOrderGiveTheClockOfTheOrderedBursts()
    {
        // 300 segments of 8 bursts each (a FIFO that overflowed over and over), each segment's
        // numbering restarting at an arbitrary offset, fed once in order and once shuffled.
        const int segments = 300;
        var random = new Random(17);
        var ordered = new List<BurstReading>();
        var startS = new double[segments];
        for (int s = 0; s < segments; s++)
        {
            long offset = random.Next(0, 1_000_000);
            startS[s] = StartS + (s * 0.5) - (offset * 1e-3);
            for (int b = 0; b < 8; b++)
            {
                long last = offset + (20L * b) + 19;
                double read = startS[s] + (last * 1e-3) + (random.NextDouble() * 0.5e-3);
                ordered.Add(new BurstReading(last, Math.Round(read * 1e6) / 1e6, s));
            }
        }

        List<BurstReading> shuffled = ordered.OrderBy(_ => random.Next()).ToList();

        SampleClock inOrder = SampleClock.Fit(ordered, 1e-3);
        SampleClock anyOrder = SampleClock.Fit(shuffled, 1e-3);

        // Only the order of the sums differs: equal to rounding.
        Assert.Equal(segments, anyOrder.SegmentCount);
        Assert.Equal(inOrder.PeriodS, anyOrder.PeriodS, 1e-15);
        Assert.Equal(inOrder.BurstsRejected, anyOrder.BurstsRejected);
        for (int s = 0; s < segments; s++)
        {
            long middle = ordered[(8 * s) + 4].LastIndex;
            Assert.Equal(inOrder.TimeOf(middle, s), anyOrder.TimeOf(middle, s), 1e-9);

            // Each origin sits on its own segment's samples: within the latency spread
            // (0.5 ms) of the true time at the segment's middle.
            Assert.Equal(startS[s] + (middle * 1e-3), anyOrder.TimeOf(middle, s), 0.5e-3);
        }
    }

    [Theory]
    [InlineData("one burst", 1)]
    [InlineData("three bursts", 3)]
    public void TooFewBurstsFallBackToTheNominalPeriod(string name, int count)
    {
        List<BurstReading> bursts = Synthetic(periodS: 1.01e-3, count: count, latencyS: 0, seed: 1);

        SampleClock clock = SampleClock.Fit(bursts, 1e-3);

        Assert.False(clock.Estimated, name);
        Assert.Equal(1e-3, clock.PeriodS);
        Assert.Equal(1e-3 * SampleClock.NominalRelativeUncertainty, clock.PeriodSigmaS);
    }

    [Fact]
    public void OneBurstIsTimedByItsReadTime()
    {
        List<BurstReading> bursts = Synthetic(periodS: 1e-3, count: 1, latencyS: 0, seed: 1);

        SampleClock clock = SampleClock.Fit(bursts, 1e-3);

        Assert.Equal(bursts[0].ReadS, clock.TimeOf(bursts[0].LastIndex, 0), 1e-12);
        Assert.Equal(bursts[0].ReadS - 19e-3, clock.TimeOf(bursts[0].LastIndex - 19, 0), 1e-12);
    }

    [Fact]
    public void CallerBugsThrow()
    {
        Assert.Throws<ArgumentException>(() => SampleClock.Fit([], 1e-3));
        Assert.Throws<ArgumentException>(() => SampleClock.Fit([new BurstReading(1, 1, 0)], 0));
        Assert.Throws<ArgumentException>(() => SampleClock.Fit([new BurstReading(1, 1, -1)], 1e-3));
    }

    private const double StartS = 100.0;

    /// <summary>Bursts of 20 samples; sample i taken at StartS + i·period, read up to
    /// <paramref name="latencyS"/> later (uniform, seeded), times rounded to the µs as the box's are.</summary>
    private static List<BurstReading> Synthetic(double periodS, int count, double latencyS, int seed)
    {
        var random = new Random(seed);
        return Enumerable.Range(0, count)
            .Select(b =>
            {
                long last = (20L * b) + 19;
                double read = StartS + (last * periodS) + (random.NextDouble() * latencyS);
                return new BurstReading(last, Math.Round(read * 1e6) / 1e6, 0);
            })
            .ToList();
    }
}
