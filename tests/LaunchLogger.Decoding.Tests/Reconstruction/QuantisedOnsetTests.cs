using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>An ideal accelerometer whose readings are rounded to a step q of 1 mg (no other
/// noise): its rest reads the same value sample after sample, so the rest's noise is read at the
/// variance floor (1e-6 m/s², <see cref="ForwardAcceleration.ReadRest"/>), yet every reading on the
/// rise is off by up to q/2 — an error spread evenly, of variance q²/12 (the uniform model of
/// quantisation noise; B. Widrow and I. Kollár 2008, "Quantization Noise", ch. 4). Taken at the
/// floor, a straight ramp's onset at 1600 Hz came out within ±2σ in 83 of 100 trials (σ 0.1–0.2 ms,
/// errors to 0.6 ms, a jump chosen over the ramp; before the mend, a scratch run). The closed forms:
/// a ramp a(τ) = peak·min(τ/T, 1) and a step (kinematics, any textbook). Coverage of a Gaussian σ
/// is 95.4 % within ±2σ (any statistics text); over 100 trials we ask 93, as the other onset tests
/// do over 200.</summary>
public class QuantisedOnsetTests
{
    private const double Gravity = 9.80665;

    private const double Step = 1e-3 * Gravity;

    /// <summary>Rate (Hz), a step (true) or a ramp of 0.05–0.4 s (false), and the most the onset may
    /// be off in 95 of 100 trials (s): a ramp's onset is pinned well within a sample by its many
    /// rising samples; a step's only to its gap between two samples (σ = period/√12).</summary>
    public static TheoryData<double, bool, double> Cases => new()
    {
        { 400, false, 0.3e-3 },
        { 1600, false, 0.1e-3 },
        { 100, true, 5e-3 },
        { 1600, true, 0.35e-3 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void A_quantised_still_sensor_gives_onsets_within_their_sigma(double rateHz, bool step, double toleranceS)
    {
        var random = new Random((int)rateHz + (step ? 1 : 0));
        double period = 1 / rateHz;
        const int trials = 100;
        int within2 = 0;
        var errors = new List<double>();
        var misses = new List<string>();
        for (int trial = 0; trial < trials; trial++)
        {
            double peak = Gravity * (0.25 + (0.85 * random.NextDouble()));
            double rise = 0.05 + (0.35 * random.NextDouble());
            double onsetS = 2.0 + (random.NextDouble() * period);
            double level = Step * Math.Round((0.1 + (0.4 * random.NextDouble())) / Step);
            Func<double, double> shape = step ? _ => peak : tau => peak * Math.Min(tau / rise, 1);
            (double[] t, double[] reading) = AccelOnsetFitTests.Sampled(rateHz, 3, onsetS, level, 0, shape, random);
            for (int i = 0; i < reading.Length; i++)
            {
                reading[i] = Step * Math.Round(reading[i] / Step);
            }

            int to = (int)Math.Ceiling((onsetS + (step ? 0.05 : rise)) * rateHz);
            AccelOnset? found = AccelOnsetFit.Find(t, reading, level, 1e-6, 1, period, 0, to, lastRise: true);
            (double error, double z) = AccelOnsetFitTests.Judged(found, onsetS);
            within2 += z <= 2 ? 1 : 0;
            errors.Add(Math.Abs(error));
            if (z > 2)
            {
                misses.Add($"{found!.Value.Shape} {error * 1e3:F2} ms ({z:F1}σ)");
            }

            // A lone jump is no grid: its σ stays that of its gap between samples, not a step's height.
            Assert.True(found!.Value.SigmaS <= period, $"σ {found.Value.SigmaS * 1e3:F2} ms beyond a sample period");
        }

        errors.Sort();
        Assert.True(within2 >= 93, $"±2σ: {within2} of {trials}: {string.Join("; ", misses.Take(8))}");
        Assert.True(errors[94] <= toleranceS, $"95 % within {errors[94] * 1e3:F3} ms, asked {toleranceS * 1e3:0.##} ms");
    }
}
