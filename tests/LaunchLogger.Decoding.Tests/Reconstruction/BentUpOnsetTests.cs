namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The accelerometer onset where a ramp-plus-quadratic bending up would read a τ² start
/// late: ramps of 0.25–0.4 s through first-order lags of 30–100 ms, in closed form
/// (<see cref="LaggedTakeUpOnsetTests.Lagged"/>, a first-order system's ramp response, any
/// linear-systems text), peaks 0.25–1.1 g, white noise of 100–300 µg/√Hz over the Nyquist band,
/// the onset anywhere within a sample. c₁τ + c₂τ² with c₁, c₂ &gt; 0 is c₂(τ + h)² − c₂h²,
/// h = c₁/(2c₂) (completing the square): on these take-ups it fitted the straighter part with its
/// onset 10–20 ms late, within 1–2 of the true shape's criterion, and the average put the onset
/// about halfway (before the change, with these seeds: 95 % within 12.5 / 9.3 / 9.8 ms at 200 /
/// 400 / 1600 Hz, 13–18 of 200 more than 8 ms late; after: 6.1 / 6.4 / 7.7 ms, at most one, the
/// 400-Hz bound set by long lags read early as a τ², not late). Coverage of a Gaussian σ is 95.4 % within ±2σ and 99.7 % within ±3σ (any
/// statistics text); over 200 onsets we ask 93 % and 98.5 %, as the other onset tests do.</summary>
public class BentUpOnsetTests
{
    /// <summary>Rate (Hz) and the most the onset may be off in 95 % of trials (s).</summary>
    public static TheoryData<double, double> Cases => new()
    {
        { 200, 8e-3 },
        { 400, 8e-3 },
        { 1600, 8e-3 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void A_lagged_take_up_is_not_read_late_as_a_slope_start(double rateHz, double toleranceS)
    {
        const int trials = 200;
        var results = LaggedTakeUpOnsetTests.DrawnTakeUps(rateHz, (int)rateHz + 7, trials, (0.25, 0.4), (0.03, 0.1));
        int within2 = results.Count(r => r.Z <= 2);
        int within3 = results.Count(r => r.Z <= 3);
        int late = results.Count(r => r.Error > 8e-3);
        var errors = results.Select(r => Math.Abs(r.Error)).ToList();
        var misses = results.Where(r => r.Z > 2 || r.Error > 8e-3).Select(r => r.Detail).ToList();
        AccelOnsetFitTests.AssertOnsets(errors, within2, within3, trials, toleranceS, misses);
        Assert.True(late <= 0.01 * trials, $"{late} of {trials} more than 8 ms late: {string.Join("; ", misses.Take(8))}");
    }
}
