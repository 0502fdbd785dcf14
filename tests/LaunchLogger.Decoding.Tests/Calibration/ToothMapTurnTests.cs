using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Calibration;

/// <summary>A saved tooth map turned to a later run, whose counter started at another tooth. The
/// truth is the construction: the rings are drawn here, and the box's counter runs from a
/// chosen hardware count, so the run's gap k is the ring's gap (origin + k) mod n.</summary>
public class ToothMapTurnTests
{
    private const double Circumference = 1.96;

    /// <summary>The map a calibration cruise would save: measured over 40 s, numbered from that
    /// cruise's own count (its counter started at hardware count 0).</summary>
    private static ToothSpacingMap Saved(double[] ring) =>
        ToothSpacingCalibration.Measure(CalibrationRuns.Cruise(ring, Circumference, speedMps: 8, durationS: 40, jitterS: 5e-6), null);

    [Theory]
    [InlineData(48, 1_000_019L, 0.0)]
    [InlineData(48, 7L, 2e-4)]
    [InlineData(12, 1_000_019L, 0.0)]
    [InlineData(12, 5L, 2e-4)]
    public void A_few_steady_revolutions_tell_which_tooth_is_which(int teeth, long origin, double bracketS)
    {
        double[] ring = ToothSpacingCalibrationTests.Ring(seed: 4, sigma: 0.01, teeth: teeth);
        ToothSpacingMap saved = Saved(ring);

        // Three seconds at 8 m/s: about 12 revolutions, too few for a map of its own (20).
        DecodedRun later = CalibrationRuns.Cruise(ring, Circumference, speedMps: 8, durationS: 3, originCount: origin, bracketS: bracketS, jitterS: 5e-6, seed: 2);
        ToothMapTurn? turn = ToothSpacingCalibration.Align(later.Pulses, saved.Spacing, saved.Sigma, out string? refusal);

        Assert.Null(ToothSpacingCalibration.Measure(later.Pulses, teeth, Circumference / teeth, "later", null, out _));
        Assert.True(turn is not null, refusal);
        Assert.Equal((int)(origin % teeth), turn.Shift);
        Assert.True(turn.Margin >= ToothSpacingCalibration.AlignmentMargin);
    }

    [Fact]
    public void A_map_of_another_ring_is_refused()
    {
        ToothSpacingMap saved = Saved(ToothSpacingCalibrationTests.Ring(seed: 9));
        DecodedRun later = CalibrationRuns.Cruise(ToothSpacingCalibrationTests.Ring(seed: 4), Circumference, speedMps: 8, durationS: 3, originCount: 11, jitterS: 5e-6);

        ToothMapTurn? turn = ToothSpacingCalibration.Align(later.Pulses, saved.Spacing, saved.Sigma, out string? refusal);

        Assert.Null(turn);
        Assert.Contains("another ring", refusal, StringComparison.Ordinal);
    }

    /// <summary>Another ring's map must never be turned to a run, whatever the brackets leave of
    /// the run's pattern: either it fits no turn, or no turn is clearly best.</summary>
    [Theory]
    [InlineData(48, 0.0)]
    [InlineData(48, 2e-4)]
    [InlineData(48, 1e-3)]
    [InlineData(12, 0.0)]
    [InlineData(12, 1e-3)]
    public void Another_rings_map_is_never_turned_to_a_run(int teeth, double bracketS)
    {
        var turned = new List<string>();
        for (int seed = 1; seed <= 20; seed++)
        {
            ToothSpacingMap saved = Saved(ToothSpacingCalibrationTests.Ring(seed: 100 + seed, sigma: 0.01, teeth: teeth));
            DecodedRun later = CalibrationRuns.Cruise(ToothSpacingCalibrationTests.Ring(seed: seed, sigma: 0.01, teeth: teeth), Circumference, speedMps: 8, durationS: 4, originCount: seed, bracketS: bracketS, jitterS: 5e-6, seed: seed);
            if (ToothSpacingCalibration.Align(later.Pulses, saved.Spacing, saved.Sigma, out _) is { } turn)
            {
                turned.Add($"seed {seed}: turn {turn.Shift}, chi2 {turn.ChiSquare:0.#}, margin {turn.Margin:0.#}");
            }
        }

        Assert.True(turned.Count == 0, string.Join("; ", turned));
    }

    [Fact]
    public void An_even_ring_gives_no_turn()
    {
        // Every turn of an even ring's map fits equally well: nothing tells the teeth apart.
        double[] even = ToothSpacingCalibrationTests.Ring(seed: 1, sigma: 0);
        double[] flat = [.. Enumerable.Repeat(1.0, 48)];
        double[] sigma = [.. Enumerable.Repeat(0.001, 48)];
        DecodedRun later = CalibrationRuns.Cruise(even, Circumference, speedMps: 8, durationS: 3, originCount: 11, jitterS: 5e-6);

        Assert.Null(ToothSpacingCalibration.Align(later.Pulses, flat, sigma, out string? refusal));
        Assert.Contains("do not tell which tooth is which", refusal, StringComparison.Ordinal);
    }

    [Fact]
    public void Too_short_a_run_is_refused_and_says_why()
    {
        double[] ring = ToothSpacingCalibrationTests.Ring(seed: 4);
        ToothSpacingMap saved = Saved(ring);
        DecodedRun later = CalibrationRuns.Cruise(ring, Circumference, speedMps: 8, durationS: 0.6, originCount: 11, jitterS: 5e-6);

        Assert.Null(ToothSpacingCalibration.Align(later.Pulses, saved.Spacing, saved.Sigma, out string? refusal));
        Assert.Contains("steady revolutions", refusal, StringComparison.Ordinal);
    }
}
