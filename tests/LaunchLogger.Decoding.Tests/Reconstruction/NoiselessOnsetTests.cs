using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>An ideal accelerometer (no noise): its rest reads the same value sample after
/// sample, so the rest's noise is read at the variance floor (1e-6 m/s², <see cref="ForwardAcceleration.ReadRest"/>).
/// A take-up the fit's shapes do not follow exactly then leaves a shape set aside (a bent-up
/// ramp-plus-quadratic, a barred lag) fitting better than the chosen one by thousands of noise
/// variances; its odds exp(−ΔBIC/2) overflowed and the onset's σ came out NaN. Take-ups in
/// closed form: a first-order lag's ramp response (any linear-systems text) and a straight ramp
/// into a pull with a driveline shunt (sines; ours, invented); the onset must be finite and
/// within the 5 ms of the truth.</summary>
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
}
