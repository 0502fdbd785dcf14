using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The slip-swing test (<see cref="SlipSwingTest"/>) both ways on the generator's truth.
/// A tyre held below or at the peak of its force–slip curve is stable and a tyre past it is not
/// (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; from memory; the peak at a slip ratio of
/// about 0.1–0.2, J. Y. Wong, "Theory of Ground Vehicles", ch. 1): a clean launch held smoothly
/// at 0.10–0.20 is valid; a wheel whose slip swings across a peak of 0.10 (0.10 ± 0.09, a cycle
/// every 32–54 ms, from first motion for 40 cycles, <see cref="SlipWobble"/>) makes the run
/// doubtful for `wheelspin` wherever its teeth and edges resolve the swing.</summary>
public class SlipSwingVerdictTests
{
    /// <summary>Edges late by 20 µs with 10 µs of jitter; polled: a 1-ms loop, 10 % jitter, one
    /// 20-ms stall a second.</summary>
    private static PrescribedRecordSpec Launch(int seed, double slip, SlipWobble? wobble, bool polled)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        return spec with
        {
            Pickup = spec.Pickup with { Slip = LaunchSpinTests.AtThePeak(spec, slip, 3), Wobble = wobble },
            Edges = new EdgeTiming(20e-6, 10e-6),
            Polled = polled ? new PolledCounter(1e-3, 0.1, 1, 0.020) : null,
        };
    }

    private static SlipWobble Across(int seed) => new(0.09, 0.03 + (0.002 * seed), 40);

    /// <summary>Seeds 1–12: every tooth count of <see cref="Records.Standing"/> (8–100) and every
    /// accelerometer rate (100–1600 Hz), held at 0.10–0.21 fading over 3 m.</summary>
    public static TheoryData<int, bool> Held => new()
    {
        { 1, false }, { 2, false }, { 3, false }, { 4, false }, { 5, false }, { 6, false },
        { 7, false }, { 8, false }, { 9, false }, { 10, false }, { 11, false }, { 12, false },
        { 1, true }, { 2, true }, { 3, true }, { 4, true }, { 5, true }, { 6, true },
        { 7, true }, { 8, true }, { 9, true }, { 10, true }, { 11, true }, { 12, true },
    };

    [Theory]
    [MemberData(nameof(Held))]
    public void A_launch_held_smoothly_at_its_tyres_peak_does_not_swing_and_is_valid(int seed, bool polled)
    {
        double slip = 0.10 + (0.01 * (seed % 11));
        PrescribedRecordSpec spec = Launch(seed, slip, null, polled);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        Assert.Equal(0, swing.Swinging);
        Assert.True(run.Verdict!.Level == VerdictLevel.Valid, $"{spec}, slip {slip}: {LaunchSpinTests.Describe(run)}");
    }

    /// <summary>24–100 teeth with edge timestamps, and 60–100 teeth polled every 1 ms. Seeds 4, 5
    /// and 11 polled: the filter does not keep their slip (it reads 0, σ 0), yet its coefficient
    /// lies many σ above an undriven wheel's, so the wheel is taken as driven
    /// (<see cref="ReconstructedRun.DrivenWheel"/>) and the swing counts; before, they were called
    /// valid.</summary>
    public static TheoryData<int, bool> Swinging => new()
    {
        { 2, false }, { 3, false }, { 4, false }, { 5, false }, { 8, false }, { 9, false }, { 10, false }, { 11, false },
        { 4, true }, { 5, true }, { 10, true }, { 11, true },
    };

    [Theory]
    [MemberData(nameof(Swinging))]
    public void A_slip_swinging_across_the_peak_makes_the_run_doubtful_for_wheelspin(int seed, bool polled)
    {
        PrescribedRecordSpec spec = Launch(seed, 0.10, Across(seed), polled);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        Assert.True(swing.Swings, $"{spec}: {swing}");
        Assert.Contains(run.Verdict!.Reasons, r => r.Code == "wheelspin");
    }

    /// <summary>What the data cannot show: a 12-tooth wheel (16 cm a tooth) gives fewer than
    /// <see cref="SlipSwingTest.LeastEdges"/> edges in a block before 1.5 s, so the launch is not
    /// judged for a swing at all.</summary>
    [Fact]
    public void A_12_tooth_wheel_has_too_few_edges_to_judge_a_swing()
    {
        PrescribedRecordSpec spec = Launch(1, 0.10, Across(1), polled: false);
        Assert.Equal(12, spec.Pickup.Teeth);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        Assert.True(swing.Blocks < SlipSwingTest.LeastBlocks, $"{swing}");
        Assert.False(swing.Swings);
    }
}
