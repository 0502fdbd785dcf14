using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Calibration;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The ring's tooth positions measured from the run itself, and what they do for the
/// rollout mark on a coarse, unevenly cut ring.</summary>
public class ToothPositionsTests
{
    private const double StartS = 5.0;

    [Theory]
    [InlineData(12, 0.015, 1)]
    [InlineData(12, 0.02, 2)]
    [InlineData(48, 0.01, 3)]
    public void Each_edge_is_placed_where_the_ring_puts_it(int teeth, double sigma, int seed)
    {
        double[] ring = ToothSpacingCalibrationTests.Ring(seed, sigma, teeth);
        DecodedRun run = CalibrationRuns.Cruise(ring, 1.9, speedMps: 12, durationS: 40, accelMps2: 0.05, jitterS: 5e-6, seed: seed);
        var channel = PulseChannel.From(run.Pulses);

        ToothPositions? measured = ToothPositions.Measure(run.Pulses, teeth, 1.9 / teeth, "cruise", priorFraction: 0.01);

        Assert.NotNull(measured);
        Assert.InRange(measured.SigmaPulses, 1e-6, 0.002);
        double[] offsets = measured.Offsets(channel);

        // The truth, in pitches from the count's even place, of mean zero over one revolution
        // (a constant is the phase's, not the ring's).
        var truth = new double[teeth];
        for (int c = 0; c < teeth; c++)
        {
            truth[c] = (teeth * ring[c]) - c - (teeth * ring[0]);
        }

        double mean = truth.Average();
        for (int i = 0; i < channel.Length; i++)
        {
            int k = (int)(channel.Counts[i] % teeth);
            double expected = truth[k] - mean;
            Assert.True(Math.Abs(offsets[i] - expected) <= 3 * measured.SigmaPulses, $"count {channel.Counts[i]}: {offsets[i]:F5} against {expected:F5} ± {measured.SigmaPulses:E2}");
        }

        double spread = Math.Sqrt(truth.Select(x => (x - mean) * (x - mean)).Average());
        Assert.True(spread > 5 * measured.SigmaPulses, $"the ring's spread {spread:F4} must show beside the map's σ {measured.SigmaPulses:F5}");
    }

    [Fact]
    public void A_run_without_steady_revolutions_gives_no_map()
    {
        double[] ring = ToothSpacingCalibrationTests.Ring(1, 0.015, 12);
        DecodedRun run = CalibrationRuns.Cruise(ring, 1.9, speedMps: 12, durationS: 2, jitterS: 5e-6);

        Assert.Null(ToothPositions.Measure(run.Pulses, 12, 1.9 / 12, "short", priorFraction: 0.01));
    }

    private static SyntheticRun Launch(int seed, int teeth, double toothError)
    {
        var random = new Random(seed * 31);
        double plateau = 3.5 + (2.5 * random.NextDouble());
        Motion motion = Motion.FromRestAt(StartS).Jerk(40, plateau / 40).Accelerate(plateau, 1.5)
            .ConstantPower(60 + (30 * random.NextDouble()), 12).BrakeToStop(5);
        return new SyntheticRun
        {
            Motion = motion,
            Seed = seed,
            Teeth = teeth,
            CircumferenceM = 1.85,
            ToothErrorFraction = toothError,
            AccelNoiseMps2 = 0.04,
        };
    }

    /// <summary>A coarse ring cut to 1.5 % of a pitch (the simulator's club hatch): the edges of
    /// the first foot are each a few millimetres off, which the mark takes over at the speed
    /// there. Placed where the run's own revolutions show them, the mark's errors shrink and
    /// the truth stays within the stated σ.</summary>
    [Fact]
    public void A_coarse_uneven_ring_times_the_first_foot_better_with_its_edges_placed()
    {
        const int Cases = 16;
        MarkErrors marks = RolloutMarks(Cases, seed => Launch(seed, teeth: 12, toothError: 0.015), ReconstructionOptions.Default);

        Assert.True(marks.Within2 >= 0.9 * Cases, $"{marks.Within2} of {Cases} within 2σ");
        Assert.True(marks.RmsPlaced < 0.6 * marks.RmsEven, $"rms {marks.RmsPlaced * 1e3:F3} ms with the edges placed, {marks.RmsEven * 1e3:F3} ms evenly");
    }

    /// <summary>The pickup on the driven wheel slips under drive, so distance comes from a second
    /// pickup on an undriven wheel, here a coarse ring cut to 1.5 % of a pitch: its edges are
    /// placed from the run's own revolutions as the first channel's are.</summary>
    [Fact]
    public void A_coarse_second_ring_used_for_distance_is_placed_too()
    {
        MarkErrors marks = RolloutMarks(
            12,
            seed =>
            {
                SyntheticRun launch = Launch(seed, teeth: 48, toothError: 0.005);
                return new SyntheticRun
                {
                    Motion = launch.Motion,
                    Seed = seed,
                    Teeth = 48,
                    CircumferenceM = launch.CircumferenceM,
                    ToothErrorFraction = 0.005,
                    AccelNoiseMps2 = launch.AccelNoiseMps2,
                    DriveSlipPerMps2 = 0.01,
                    SecondTeeth = 12,
                    SecondToothErrorFraction = 0.015,
                };
            },
            ReconstructionOptions.Default,
            placed => Assert.Equal(1, placed.DistanceChannel));

        Assert.True(marks.RmsPlaced < 0.4 * marks.RmsEven, $"rms {marks.RmsPlaced * 1e3:F3} ms with the second ring's edges placed, {marks.RmsEven * 1e3:F3} ms evenly; {marks.PerSeed}");
    }

    /// <summary>A run too short for a map of its own (a launch to about 25 km/h, two seconds
    /// held, then a stop) on the same coarse ring, with the ring's map saved from another
    /// session: its numbering starts five teeth on. The map's gaps are the ring's true ones
    /// (from the drawn edges), σ 0.2 % each. Turned to the run by the held speed's revolutions,
    /// it places the first foot's edges as the run alone cannot.</summary>
    [Fact]
    public void A_saved_map_places_the_edges_of_a_run_too_short_for_its_own()
    {
        const int Cases = 12;
        const int Teeth = 12;
        const int Shift = 5;
        MarkErrors marks = RolloutMarks(
            Cases,
            seed => ShortLaunchWithSavedMap(seed, Teeth, Shift).Run,
            seed => ReconstructionOptions.Default with { SavedToothGaps = ShortLaunchWithSavedMap(seed, Teeth, Shift).Saved },
            withMap =>
            {
                string note = Assert.Single(withMap.Warnings, w => w.Contains("tooth-spacing map", StringComparison.Ordinal));
                Assert.Contains($"its entry {Shift} taken as this run's tooth 0", note, StringComparison.Ordinal);
                Assert.DoesNotContain("weighed with the map the run itself gives", note, StringComparison.Ordinal);
            },
            ReconstructionOptions.Default);

        Assert.True(marks.Within2 >= 0.9 * Cases, $"{marks.Within2} of {Cases} within 2σ");
        Assert.True(marks.RmsPlaced < 0.6 * marks.RmsEven, $"rms {marks.RmsPlaced * 1e3:F3} ms with the saved map, {marks.RmsEven * 1e3:F3} ms without");
    }

    [Fact]
    public void The_settings_map_reaches_the_reconstruction_through_the_analysis()
    {
        (SyntheticRun synthetic, ToothGaps saved) = ShortLaunchWithSavedMap(seed: 3, teeth: 12, shift: 7);
        var settings = new CalibrationSettings { ToothSpacing = saved.Spacing, ToothSpacingSigma = saved.Sigma };

        RunAnalysis analysis = RunAnalyzer.Analyze(synthetic.Build(), new AnalysisOptions { Calibration = settings, BrakeSlip = BrakeSlipPrior.None });

        Assert.Contains(analysis.Reconstruction.Warnings, w => w.Contains("its entry 7 taken as this run's tooth 0", StringComparison.Ordinal));
    }

    /// <summary>The short launch on a coarse ring, and the ring's true gaps as a map saved from a
    /// session whose numbering started <paramref name="shift"/> teeth on (σ 0.2 % each).</summary>
    private static (SyntheticRun Run, ToothGaps Saved) ShortLaunchWithSavedMap(int seed, int teeth, int shift)
    {
        var random = new Random(seed * 17);
        double plateau = 3.0 + (2.0 * random.NextDouble());
        var synthetic = new SyntheticRun
        {
            Motion = Motion.FromRestAt(StartS).Jerk(40, plateau / 40).Accelerate(plateau, 1.2).Cruise(2.5).BrakeToStop(5),
            Seed = seed,
            Teeth = teeth,
            CircumferenceM = 1.85,
            ToothErrorFraction = 0.015,
            AccelNoiseMps2 = 0.04,
        };
        double[] error = synthetic.ToothErrorsM();
        double mpp = synthetic.MetresPerPulse;
        var gaps = new double[teeth];
        for (int j = 0; j < teeth; j++)
        {
            // Saved entry j is the run's gap (j − shift) mod n, which ends at that count's edge.
            int k = ((j - shift) % teeth + teeth) % teeth;
            gaps[j] = (mpp + error[k] - error[(k + teeth - 1) % teeth]) / mpp;
        }

        return (synthetic, new ToothGaps(gaps, [.. Enumerable.Repeat(0.002, teeth)]));
    }

    /// <summary>The rollout mark's errors over <paramref name="cases"/> seeds, with the edges placed
    /// (<paramref name="placed"/>'s options, each within 3σ, then <paramref name="check"/>) and
    /// against <paramref name="even"/>'s options (by default: every edge on its even place).</summary>
    private static MarkErrors RolloutMarks(int cases, Func<int, SyntheticRun> make, Func<int, ReconstructionOptions> placed, Action<ReconstructedRun>? check = null, ReconstructionOptions? even = null)
    {
        var placedErrors = new List<double>();
        var evenErrors = new List<double>();
        int within2 = 0;
        for (int seed = 1; seed <= cases; seed++)
        {
            SyntheticRun synthetic = make(seed);
            DecodedRun decoded = synthetic.Build();
            double truth = synthetic.Motion.TimeAtDistance(TrajectoryProbe.Foot)!.Value;
            ReconstructedRun withPlaces = SyntheticRun.Reconstruct(decoded, placed(seed));
            check?.Invoke(withPlaces);
            Estimate mark = withPlaces.RolloutTimeS!.Value;
            Estimate evenly = SyntheticRun.Reconstruct(decoded, even ?? ReconstructionOptions.Default with { MeasureToothPositions = false }).RolloutTimeS!.Value;
            placedErrors.Add(mark.Value - truth);
            evenErrors.Add(evenly.Value - truth);
            Assert.True(Math.Abs(mark.Value - truth) <= 3 * mark.Sigma, $"seed {seed}: {(mark.Value - truth) * 1e3:F2} ms ± {mark.Sigma * 1e3:F2}");
            within2 += Math.Abs(mark.Value - truth) <= 2 * mark.Sigma ? 1 : 0;
        }

        string perSeed = string.Join(" ", placedErrors.Zip(evenErrors, (p, e) => $"{p * 1e3:F2}/{e * 1e3:F2}"));
        return new MarkErrors(Rms(placedErrors), Rms(evenErrors), within2, perSeed);
    }

    private static MarkErrors RolloutMarks(int cases, Func<int, SyntheticRun> make, ReconstructionOptions placed, Action<ReconstructedRun>? check = null)
        => RolloutMarks(cases, make, _ => placed, check);

    /// <summary>Rms of the rollout mark's errors with the edges placed and evenly, s; how many
    /// placed marks lay within 2σ; each seed's errors in ms (placed/even).</summary>
    private sealed record MarkErrors(double RmsPlaced, double RmsEven, int Within2, string PerSeed);

    private static double Rms(List<double> values) => Math.Sqrt(values.Average(x => x * x));
}
