using LaunchLogger.Decoding.Braking;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>The ramp fit on its own: a level, a linear rise of length T from t₀, and a plateau
/// (the model of <see cref="BrakeOnsetFit"/>), sampled off the sample grid; the truth is the
/// prescribed t₀ and T (closed form: the deceleration is piecewise linear by construction).</summary>
public class BrakeOnsetFitTests
{
    private const double RateHz = 200;

    [Theory]
    [InlineData(0.0)]
    [InlineData(0.05)]
    [InlineData(0.3)]
    [InlineData(1.0)]
    [InlineData(2.0)]
    public void FindsTheOnsetAndTheRiseBetweenSamples(double riseS)
    {
        // t₀ = 4.0037 s lies 0.7 ms past a sample: the search must refine between samples (a step
        // is placed only to within the sample step, since any t₀ between two samples fits it alike).
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: riseS, plateauDecel: 7, standstillS: 9);
        Estimate onset = Fit(s, out double rise)!.Value;
        Assert.Equal(4.0037, onset.Value, riseS > 0 ? 0.0005 : 1 / RateHz);
        Assert.Equal(riseS, rise, Math.Max(0.02 * riseS, 0.003));
    }

    [Fact]
    public void AnOffsetInTheAccelerationIsFittedAsTheLevel()
    {
        // A box tilted 3° reads g0·sin 3° = 0.51 m/s² more throughout: the onset stays put.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9);
        double[] tilted = [.. s.A.Select(a => a + 0.51)];
        Estimate onset = BrakeOnsetFit.Fit(s.T, tilted, s.T, s.A, 0, s.PeakS, s.StandstillS, out _)!.Value;
        Assert.Equal(4.0037, onset.Value, 0.0005);
    }

    [Fact]
    public void TheWindowOpensAfterTheLastDrive()
    {
        // Drive at 3 m/s² until 3.5 s, then cruise (drag 0.3 m/s²) until the brakes at 4.0037 s.
        // Within the 3 s look-back the drive would be taken as part of the level, and the level
        // fitted between +3 and −0.3 would move the onset.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9, driveUntilS: 3.5, driveMps2: 3);
        Assert.Equal(4.0037, Fit(s, out _)!.Value.Value, 0.0005);
    }

    [Fact]
    public void WhatHappensLongAfterTheRiseDoesNotMoveIt()
    {
        // The driver presses harder 3.5 s after the brakes came on (7 → 9.5 m/s² at 7.5 s): the
        // fit sees the stop only up to 3 s past its half-way point, so the onset stays put.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 11);
        double[] a = [.. s.A.Select((x, i) => s.T[i] >= 7.5 ? -9.5 : x)];
        Estimate onset = BrakeOnsetFit.Fit(s.T, a, null, null, 0, s.PeakS, s.StandstillS, out double rise)!.Value;
        Assert.Equal(4.0037, onset.Value, 0.0005);
        Assert.Equal(0.3, rise, 0.006);
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(1.0)]
    public void WithoutNoiseSigmaIsTheSampleStepAndTheShapeOfTheRise(double riseS)
    {
        // The stated rule: the statistical width at least a sample period over √12, with a model
        // error of 1 % of the rise plus 4 ms for a real rise's shape, in quadrature. A slow rise
        // (from 0.5 s) is timed on its foot, a quarter of it, where the same shape moves the
        // onset (1/4)² as far: 1 % × 1 s / 16 + 4 ms.
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: riseS, plateauDecel: 7, standstillS: 9);
        Estimate onset = Fit(s, out double rise)!.Value;
        double share = riseS >= BrakeOnsetFit.LocalRiseS ? BrakeOnsetFit.LocalShare : 1;
        double model = (BrakeOnsetFit.ModelErrorPerRise * rise * share * share) + BrakeOnsetFit.ModelErrorS;
        double step = 1 / RateHz / Math.Sqrt(12);
        Assert.Equal(Math.Sqrt((step * step) + (model * model)), onset.Sigma, 4);
        Assert.Equal(riseS, rise, 0.01);
    }

    /// <summary>Rises that are not straight: the slope changes by κ along the rise, growing
    /// (a pedal eased on, κ > 0) or falling off (pressure building like a lag, κ < 0); the
    /// deceleration over the rise is level + P·(u + κ·(u² − u)/2), u = (t − t₀)/T, whose foot is t₀
    /// by construction (closed form). A straight line fitted over the whole rise moves its foot by
    /// about κ·T/12 (the least squares of a quadratic by a line), the model error's 1 % of the
    /// rise at κ ≈ 0.12; over its first quarter the foot moves (1/4)² as far.</summary>
    [Theory]
    [InlineData(1.0, 0.1)]
    [InlineData(1.0, -0.1)]
    [InlineData(2.0, 0.1)]
    [InlineData(2.0, -0.1)]
    [InlineData(3.5, 0.1)]
    [InlineData(3.5, -0.1)]
    public void ASlowRiseThatIsNotStraightIsTimedOnItsFootWithinSigma(double riseS, double kappa)
    {
        const double onsetS = 4.0037, level = 0.3, plateau = 7;
        int n = (int)(12 * RateHz);
        double[] t = new double[n], a = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i / RateHz;
            double u = Math.Clamp((t[i] - onsetS) / riseS, 0, 1);
            a[i] = -(level + ((plateau - level) * (u + (kappa * ((u * u) - u) / 2))));
        }

        Estimate onset = BrakeOnsetFit.Fit(t, a, null, null, 0, 1.0, 12, out double rise)!.Value;
        double error = onset.Value - onsetS;
        double wholeRule = (BrakeOnsetFit.ModelErrorPerRise * riseS) + BrakeOnsetFit.ModelErrorS;
        Assert.True(Math.Abs(error) <= onset.Sigma, FormattableString.Invariant($"onset {error * 1e3:+0.00;-0.00} ms, σ {onset.Sigma * 1e3:0.00} ms, rise {rise:0.000} s"));
        Assert.True(onset.Sigma < 0.5 * wholeRule, FormattableString.Invariant($"σ {onset.Sigma * 1e3:0.00} ms against {wholeRule * 1e3:0.00} ms"));
    }

    [Fact]
    public void NoiseWidensSigmaAndTheTruthStaysWithinIt()
    {
        // White noise of 0.2 and 0.8 m/s² on the same stop, 20 seeds each: the truth within 3σ in
        // at least 19 of 20, and the noisier σ wider on average.
        double[] mean = new double[2];
        double[] noise = [0.2, 0.8];
        for (int k = 0; k < 2; k++)
        {
            int inside = 0;
            for (int seed = 1; seed <= 20; seed++)
            {
                Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9, noise: noise[k], seed: seed);
                Estimate onset = Fit(s, out _)!.Value;
                inside += Math.Abs(onset.Value - 4.0037) <= 3 * onset.Sigma ? 1 : 0;
                mean[k] += onset.Sigma / 20;
            }

            Assert.True(inside >= 19, $"noise {noise[k]}: {inside} of 20 within 3σ");
        }

        Assert.True(mean[1] > 1.3 * mean[0], $"σ {mean[0] * 1e3:F2} ms at 0.2 m/s², {mean[1] * 1e3:F2} ms at 0.8 m/s²");
    }

    [Fact]
    public void TooFewSamplesOrNoFirmDecelerationGiveNoOnset()
    {
        Signal s = Signal.Make(levelDecel: 0.3, onsetS: 4.0037, riseS: 0.3, plateauDecel: 7, standstillS: 9);
        Assert.Null(BrakeOnsetFit.Fit(s.T[..9], s.A[..9], null, null, 0, 0, 9, out double rise));
        Assert.True(double.IsNaN(rise));

        // Times that do not advance.
        double[] flat = [.. s.T.Select(_ => 1.0)];
        Assert.Null(BrakeOnsetFit.Fit(flat, s.A, null, null, 0, 0, 9, out _));

        // A gentle slowing whose full deceleration is 0.4 m/s² is no stop to time.
        Signal gentle = Signal.Make(levelDecel: 0.0, onsetS: 4.0037, riseS: 0.3, plateauDecel: 0.4, standstillS: 9);
        Assert.Null(Fit(gentle, out _));

        // Standstill within a few samples of the peak: nothing to fit.
        Assert.Null(BrakeOnsetFit.Fit(s.T, s.A, null, null, 0, 8.99, 9, out _));
    }

    private static Estimate? Fit(Signal s, out double riseS) =>
        BrakeOnsetFit.Fit(s.T, s.A, null, null, 0, s.PeakS, s.StandstillS, out riseS);

    /// <summary>Samples at <see cref="RateHz"/> of a = −deceleration: drive (optional), a level,
    /// a linear rise, a plateau to standstill.</summary>
    internal sealed record Signal(double[] T, double[] A, double PeakS, double StandstillS)
    {
        public static Signal Make(double levelDecel, double onsetS, double riseS, double plateauDecel, double standstillS, double driveUntilS = 0, double driveMps2 = 0, double noise = 0, int seed = 1)
        {
            var random = new Random(seed);
            int n = (int)(standstillS * RateHz);
            var t = new double[n];
            var a = new double[n];
            for (int i = 0; i < n; i++)
            {
                t[i] = i / RateHz;
                double x = t[i] - onsetS;
                double decel = x < 0 ? levelDecel
                    : riseS > 0 && x < riseS ? levelDecel + ((plateauDecel - levelDecel) * x / riseS)
                    : plateauDecel;
                a[i] = (t[i] < driveUntilS ? driveMps2 : -decel) + (noise * Gaussian(random));
            }

            return new Signal(t, a, Math.Max(driveUntilS, 1.0), standstillS);
        }

        // Box–Muller (Knuth, TAOCP vol. 2, 3.4.1).
        private static double Gaussian(Random random) =>
            Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
    }
}
