namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The accelerometer onset on take-ups through a long lag, 85–150 ms (the driveline's
/// compliance at the long end of what the generator draws), behind ramps of 0.2–0.4 s, in closed
/// form (<see cref="LaggedTakeUpOnsetTests.Lagged"/>, a first-order system's ramp response, any
/// linear-systems text), peaks 0.25–1.1 g, white noise of 100–300 µg/√Hz over the Nyquist band,
/// the onset anywhere within a sample. Such a rise starts as c·τ²/(2λ) and straightens only after
/// a lag or two, its foot below the noise; c₂τ² alone, the limit of the smooth-start shapes that
/// can bend (c₃ or c₄ = 0, λ → ∞), fits it nearly as well with its onset moved early and wins the
/// criterion by its one parameter fewer. With it chosen (before the change, these seeds): 95 %
/// within 7.4 / 9.2 / 11.4 ms at 100 / 400 / 1600 Hz, 7 / 11 / 16 of 200 more than 8 ms early
/// (c₂τ² chosen 7 / 12 / 19 times); set aside: 6.1 / 7.0 / 6.6 ms, 4 / 7 / 3; ±2σ 100 % both
/// ways. Coverage of a Gaussian σ is 95.4 % within ±2σ and
/// 99.7 % within ±3σ (any statistics text); over 200 onsets we ask 93 % and 98.5 %, as the
/// other onset tests do.</summary>
public class LongLagOnsetTests
{
    /// <summary>Rate (Hz), the most the onset may be off in 95 % of trials (s), and how many of
    /// 200 may read more than 8 ms early (4 %).</summary>
    public static TheoryData<double, double, int> Cases => new()
    {
        { 100, 8e-3, 8 },
        { 400, 8e-3, 8 },
        { 1600, 8e-3, 8 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void A_long_lag_is_not_read_early_as_a_pure_square(double rateHz, double toleranceS, int earlyAllowed)
    {
        const int trials = 200;
        var results = LaggedTakeUpOnsetTests.DrawnTakeUps(rateHz, (int)rateHz + 85, trials, (0.2, 0.4), (0.085, 0.15));
        int within2 = results.Count(r => r.Z <= 2);
        int within3 = results.Count(r => r.Z <= 3);
        int early = results.Count(r => r.Error < -8e-3);
        var errors = results.Select(r => Math.Abs(r.Error)).ToList();
        var misses = results.Where(r => r.Z > 2 || r.Error < -8e-3).Select(r => r.Detail).ToList();
        AccelOnsetFitTests.AssertOnsets(errors, within2, within3, trials, toleranceS, misses);
        Assert.True(early <= earlyAllowed, $"{early} of {trials} more than 8 ms early: {string.Join("; ", misses.Take(8))}");
    }
}
