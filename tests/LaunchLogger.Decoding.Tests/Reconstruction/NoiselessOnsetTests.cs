using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>An ideal accelerometer (no noise): its rest reads the same value sample after
/// sample, so the rest's noise is read at the variance floor (1e-6 m/s², <see cref="ForwardAcceleration.ReadRest"/>).
/// A take-up the fit's shapes do not follow exactly then leaves a shape set aside (a bent-up
/// ramp-plus-quadratic, a barred lag) fitting better than the chosen one by thousands of noise
/// variances; its odds exp(−ΔBIC/2) overflowed and the onset's σ came out NaN (the hatch's
/// take-up below; the closed-form take-ups of the theory did not overflow before the mend and are
/// kept as checks that the mend leaves them right: a first-order lag's ramp response, any
/// linear-systems text, and a straight ramp into a pull with a shunt of sines, ours, invented).
/// The onset must be finite and within the 5 ms of the truth.</summary>
public class NoiselessOnsetTests
{
    private const double Gravity = 9.80665;

    public static TheoryData<double, double, double, bool> Cases => new()
    {
        { 100, 0.175, 0.04, false }, { 100, 0.175, 0.0, true }, { 200, 0.3, 0.06, false }, { 400, 0.25, 0.1, false }, { 100, 0.1, 0.0, true },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void A_noiseless_take_up_gives_a_finite_onset_at_the_truth(double rateHz, double riseS, double lagS, bool shunt)
    {
        double period = 1 / rateHz;
        double peak = 0.48 * Gravity;
        double onsetS = 2.0 + (0.6 * period);
        Func<double, double> take = shunt
            ? tau => tau < riseS ? peak * tau / riseS : peak - 0.15 + (0.15 * Math.Sin(2 * Math.PI * 33 * (tau - riseS))) + (0.1 * Math.Sin((2 * Math.PI * 21 * (tau - riseS)) + 1))
            : tau => LaggedTakeUpOnsetTests.Lagged(tau, peak, riseS, lagS);
        (double[] t, double[] reading) = AccelOnsetFitTests.Sampled(rateHz, 3, onsetS, 0, 0, take, new Random(1));
        int to = (int)Math.Ceiling((onsetS + riseS + 0.15) * rateHz);
        AccelOnset? found = AccelOnsetFit.Find(t, reading, 0, 1e-6, 1, period, 0, to, lastRise: true);

        Assert.NotNull(found);
        Assert.True(double.IsFinite(found.Value.TimeS) && double.IsFinite(found.Value.SigmaS), $"onset {found}");
        Assert.True(Math.Abs(found.Value.TimeS - onsetS) <= 5e-3, $"onset {(found.Value.TimeS - onsetS) * 1e3:F2} ms off, σ {found.Value.SigmaS * 1e3:F2} ms");
    }

    /// <summary>The forward acceleration a simulated hatch's truth gave every 10 ms from 45.01 s (exactly
    /// 0 before; true onset 45.00604 s; the first pulse at 45.34 s): a 0.175-s ramp into a pull with a
    /// shunt of a few tenths of m/s². The bent-up ramp-plus-quadratic, set aside, fits it better than
    /// the ramp by 3.7e-8 (m/s²)² of residual: at the floor's noise the odds were exp(18 000).</summary>
    private static readonly double[] HatchTake = [0.10670, 0.37958, 0.65245, 0.92531, 1.19817, 1.47101, 1.74385, 2.01667, 2.28947, 2.56225, 2.83500, 3.10771, 3.38036, 3.65290, 3.92527, 4.19444, 4.46360, 4.72136, 4.50961, 4.28422, 4.70704, 4.47883, 4.28792, 4.70882, 4.55320, 4.46884, 4.78697, 4.77308, 4.67277, 4.60617, 4.48964, 4.77839, 4.64074, 4.74360, 4.64950, 4.46417, 4.76900, 4.70137, 4.58678, 4.78216];

    [Fact]
    public void A_noiseless_hatch_take_up_gives_a_finite_onset_at_the_truth()
    {
        const double period = 0.01;
        const int rest = 301;
        var t = new double[rest + HatchTake.Length];
        var reading = new double[t.Length];
        for (int i = 0; i < t.Length; i++)
        {
            t[i] = 42.0 + (i * period);
            reading[i] = i < rest ? 0 : HatchTake[i - rest];
        }

        int to = Array.FindIndex(t, x => x >= 45.34 - 1e-9);
        AccelOnset? found = AccelOnsetFit.Find(t, reading, 0, 1e-6, 1, period, 0, to, lastRise: true);

        Assert.NotNull(found);
        Assert.True(double.IsFinite(found.Value.TimeS) && double.IsFinite(found.Value.SigmaS), $"onset {found}");
        Assert.True(Math.Abs(found.Value.TimeS - 45.00604) <= 5e-3, $"onset {(found.Value.TimeS - 45.00604) * 1e3:F2} ms off, σ {found.Value.SigmaS * 1e3:F2} ms");
    }
}
