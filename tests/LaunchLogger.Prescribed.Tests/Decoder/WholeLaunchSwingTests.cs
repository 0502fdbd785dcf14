using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The slip swing judged over the whole launch (<see cref="SlipSwing.SwingsAsAWhole"/>:
/// the blocks' χ² summed against the χ² law on their degrees of freedom summed), both ways on the
/// generator's truth. A tyre past the peak of its force–slip curve runs up and bites again; one
/// below it slips in proportion to its force (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1;
/// from memory). Pickups of 8–100 teeth, edge timestamps or a counter polled every 0.1–8 ms (10 %
/// jitter, one 20-ms stall a second).</summary>
public class WholeLaunchSwingTests
{
    /// <summary>A standing start of <paramref name="seed"/> (<see cref="Records.Standing"/>) on a
    /// driven wheel: held at a peak slip of 0.10–0.20 fading over 3 m
    /// (<see cref="LaunchSpinTests.AtThePeak"/>), or shunted (<see cref="ShuntedLaunchTests.Shunted"/>,
    /// slip k·a below the peak); with a slip also swinging across the peak when
    /// <paramref name="swinging"/> (0.09 either side, a cycle every 32–54 ms, as in
    /// <see cref="SlipSwingVerdictTests"/>).</summary>
    private static PrescribedRecordSpec Launch(int seed, bool shunted, int teeth, double pollS, bool swinging)
    {
        PrescribedRecordSpec spec = shunted ? ShuntedLaunchTests.Shunted(seed, polled: false) : Records.Standing(seed);
        if (!shunted)
        {
            spec = spec with { Pickup = spec.Pickup with { Slip = LaunchSpinTests.AtThePeak(spec, 0.10 + (0.01 * (seed % 11)), 3) } };
        }

        return spec with
        {
            Pickup = spec.Pickup with { Teeth = teeth, Wobble = swinging ? new SlipWobble(0.09, 0.03 + (0.002 * seed), 40) : null },
            Edges = new EdgeTiming(20e-6, 10e-6),
            Polled = pollS > 0 ? new PolledCounter(pollS, 0.1, 1, 0.020) : null,
        };
    }

    /// <summary>The quantile the launch is judged at, against a closed form: χ² on 2 degrees of
    /// freedom is exponential with mean 2, its upper tail e^(−x/2) (M. Abramowitz and I. A. Stegun,
    /// "Handbook of Mathematical Functions", 26.4.21 with ν = 2), so its 1 − 10⁻⁴ point is
    /// 2·ln 10⁴ = 18.4207.</summary>
    [Fact]
    public void The_launch_is_judged_at_its_chi_square_laws_point_of_one_in_ten_thousand()
    {
        Assert.Equal(1e-4, SlipSwingTest.LaunchFalseRate);
        double point = 2 * Math.Log(1e4);
        Assert.False(new SlipSwing(1, 0, 0, ChiSquare: point - 0.01, DegreesOfFreedom: 2).SwingsAsAWhole);
        Assert.True(new SlipSwing(1, 0, 0, ChiSquare: point + 0.01, DegreesOfFreedom: 2).Swings);
        Assert.False(new SlipSwing(0, 0, 0).Swings);
    }

    /// <summary>Clean driven launches across tooth counts and poll periods — among them the ones
    /// whose summed χ² came nearest its point in a survey of 96 clean launches (held at the peak,
    /// polled every 3 ms: 1 − p 9.6·10⁻⁴ and 3.3·10⁻³; the held launch slip fades over 3 m, which
    /// is not k·a, and the cubics take it only in part): valid, no wheelspin, the launch not
    /// swinging as a whole.</summary>
    [Theory]
    [InlineData(4, false, 36, 3e-3)]
    [InlineData(9, false, 60, 3e-3)]
    [InlineData(6, false, 60, 1e-3)]
    [InlineData(7, false, 100, 1e-3)]
    [InlineData(2, false, 60, 8e-3)]
    [InlineData(8, false, 8, 3e-3)]
    [InlineData(2, false, 12, 1e-3)]
    [InlineData(10, false, 16, 0)]
    [InlineData(7, true, 100, 1e-3)]
    [InlineData(3, true, 24, 3e-3)]
    [InlineData(12, true, 60, 8e-3)]
    [InlineData(1, true, 60, 1e-3)]
    [InlineData(5, true, 100, 0)]
    [InlineData(3, true, 60, 1e-4)]
    public void A_clean_driven_launch_does_not_swing_as_a_whole(int seed, bool shunted, int teeth, double pollS)
    {
        PrescribedRecordSpec spec = Launch(seed, shunted, teeth, pollS, swinging: false);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        string what = $"{spec}: {swing} | {LaunchSpinTests.Describe(run)}";
        Assert.False(swing.SwingsAsAWhole, what);
        Assert.DoesNotContain(run.Verdict!.Reasons, r => r.Code == "wheelspin");
        Assert.True(run.Verdict.Level == VerdictLevel.Valid, what);
    }

    /// <summary>The other way: a slip swinging across the peak under a shunt, on a 12-tooth wheel
    /// with edge timestamps (two blocks, short of the three the blocks one by one are judged on)
    /// and on a 16-tooth wheel polled every 1 ms (no block past its own point): the blocks one by
    /// one do not call the swing, the launch as a whole does, and the run is doubtful for
    /// wheelspin.</summary>
    [Theory]
    [InlineData(10, 12, 0)]
    [InlineData(6, 16, 1e-3)]
    public void A_swing_no_block_shows_alone_is_doubted_over_the_whole_launch(int seed, int teeth, double pollS)
    {
        PrescribedRecordSpec spec = Launch(seed, shunted: true, teeth, pollS, swinging: true);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        string what = $"{spec}: {swing} | {LaunchSpinTests.Describe(run)}";
        Assert.False(swing.SwingsByBlocks, what);
        Assert.True(swing.SwingsAsAWhole, what);
        VerdictReason reason = Assert.Single(run.Verdict!.Reasons, r => r.Code == "wheelspin");
        Assert.Contains("degrees of freedom", reason.Text, StringComparison.Ordinal);
    }

    /// <summary>Launches held at their tyre's peak (0.10–0.21 fading over 3 m, slip not k·a) whose
    /// filter does not keep the slip law — <see cref="ReconstructedRun.WheelSlipPerMps2"/> reads
    /// 0, σ 0 — while its coefficient lies above an undriven wheel's by far more than 3σ: found in
    /// a survey of 240 launches (seeds 1–12, held or shunted, edges or polls of 0.1 / 1 / 3 / 8 ms),
    /// where these 10 swung by the test and were called valid. With the slip swinging across the
    /// peak the run is doubtful for wheelspin; the same launch without the swing is valid, and its
    /// wheel is taken as driven all the same (the verdict turns on the swing, not on the slip).</summary>
    [Theory]
    [InlineData(11, 48, 1e-3)]
    [InlineData(12, 60, 1e-3)]
    [InlineData(3, 48, 1e-3)]
    [InlineData(4, 60, 1e-3)]
    [InlineData(5, 100, 1e-3)]
    [InlineData(5, 60, 1e-4)]
    [InlineData(7, 100, 0)]
    [InlineData(9, 100, 3e-3)]
    [InlineData(9, 16, 1e-4)]
    [InlineData(9, 24, 1e-3)]
    public void A_held_launch_whose_slip_is_found_but_not_kept_is_judged_as_driven_both_ways(int seed, int teeth, double pollS)
    {
        foreach (bool swinging in new[] { true, false })
        {
            PrescribedRecordSpec spec = Launch(seed, shunted: false, teeth, pollS, swinging);
            RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);
            ReconstructedRun rec = run.Reconstruction;
            string what = $"{spec}, swinging {swinging}: {rec.SlipSwing} | {LaunchSpinTests.Describe(run)}";

            Assert.True(rec.DrivenWheel, what);
            if (swinging)
            {
                Assert.Equal(new Estimate(0, 0), rec.WheelSlipPerMps2);
                Assert.True(rec.SlipSwing!.Swings, what);
                Assert.Contains(run.Verdict!.Reasons, r => r.Code == "wheelspin");
            }
            else
            {
                Assert.False(rec.SlipSwing!.Swings, what);
                Assert.True(run.Verdict!.Level == VerdictLevel.Valid, what);
            }
        }
    }

    /// <summary>The other way: a wheel with no drive slip (the generator's undriven pickup,
    /// <see cref="Records.Standing"/> as it comes) is not taken as driven, and the run is valid.</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(4)]
    [InlineData(7)]
    [InlineData(10)]
    public void A_wheel_with_no_drive_slip_is_not_taken_as_driven(int seed)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        Assert.False(run.Reconstruction.DrivenWheel, $"{spec}: {LaunchSpinTests.Describe(run)}");
        Assert.True(run.Verdict!.Level == VerdictLevel.Valid, $"{spec}: {LaunchSpinTests.Describe(run)}");
    }

    /// <summary>The user's word on the wheel decides before the estimate: a launch held at its
    /// peak with its slip swinging (seed 4, 60 teeth, polled every 1 ms; doubted when not told) is
    /// not held against the run when told undriven; told driven, the same launch is doubted, and a
    /// wheel with no drive slip told driven is not taken as driven (its slip must show it: a swing
    /// that follows the body's pitch is no spin).</summary>
    [Fact]
    public void The_told_wheel_decides_the_gate()
    {
        static AnalysisOptions Told(PickupWheel wheel) => new() { Calibration = new CalibrationSettings { PickupWheel = wheel } };

        PrescribedRecordSpec swinging = Launch(4, shunted: false, 60, 1e-3, swinging: true);
        RunAnalysis undriven = Assert.Single(DecoderHarness.AnalyzeText(swinging.Generate(), Told(PickupWheel.Undriven)).Runs);
        Assert.False(undriven.Reconstruction.DrivenWheel);
        Assert.True(undriven.Reconstruction.SlipSwing!.Swings, $"{swinging}: {undriven.Reconstruction.SlipSwing}");
        Assert.DoesNotContain(undriven.Verdict!.Reasons, r => r.Code == "wheelspin");

        RunAnalysis toldDriven = Assert.Single(DecoderHarness.AnalyzeText(swinging.Generate(), Told(PickupWheel.Driven)).Runs);
        Assert.True(toldDriven.Reconstruction.DrivenWheel);
        Assert.Contains(toldDriven.Verdict!.Reasons, r => r.Code == "wheelspin");

        PrescribedRecordSpec plain = Records.Standing(4);
        RunAnalysis driven = Assert.Single(DecoderHarness.AnalyzeText(plain.Generate(), Told(PickupWheel.Driven)).Runs);
        Assert.False(driven.Reconstruction.DrivenWheel);
        Assert.Equal(VerdictLevel.Valid, driven.Verdict!.Level);
    }
}
