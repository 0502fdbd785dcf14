using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Spin seen in the pulses alone (<c>PulseSpinBound</c>), both ways on the generator's
/// truth, with no accelerometer. A tyre at or below the peak of its force–slip curve slips by at
/// most about 0.1–0.2 (J. Y. Wong, "Theory of Ground Vehicles", ch. 1; H. B. Pacejka, "Tire and
/// Vehicle Dynamics", ch. 1; from memory) and a road or track tyre grips with μ up to about 1.3
/// (Wong, ch. 1, for road tyres; track tyres from memory): every clean launch below, whatever its
/// profile, teeth (8–100) or poll (0.1–10 ms), is valid; a wheel that ran away past the peak to a
/// slip ratio of 0.57–0.97 once the car was moving at a few m/s (<see cref="WheelSpin"/>) makes the
/// run doubtful for <c>wheelspin</c>.</summary>
public class PulseSpinBoundTests
{
    private static readonly double[] Polls = [0, 1e-4, 3e-4, 1e-3, 3e-3, 1e-2];

    /// <summary><paramref name="spec"/> with pulses only, polled as seed <paramref name="seed"/>
    /// says (edge timestamps, or every 0.1–10 ms with 10 % jitter).</summary>
    private static PrescribedRecordSpec PulsesOnly(PrescribedRecordSpec spec, int seed) => spec with
    {
        Accel = null,
        Polled = Polls[seed % Polls.Length] is var p && p > 0 ? new PolledCounter(p, 0.1) : null,
    };

    private static RunAnalysis Analyse(PrescribedRecordSpec spec) => Assert.Single(DecoderHarness.AnalyzeText(spec.Generate()).Runs);

    private static void AssertValid(PrescribedRecordSpec spec, RunAnalysis run)
    {
        Assert.True(run.Verdict!.Level == VerdictLevel.Valid, $"{spec}: {LaunchSpinTests.Describe(run)}");
        Assert.Empty(run.Reconstruction.PulseSpinWindows);
    }

    /// <summary>Seeds 1–12: the standing starts of <see cref="Records.Standing"/> (their profiles,
    /// shifts and 8–100 teeth), held at a slip of 0.10–0.20 fading over 3 m.</summary>
    public static TheoryData<int> Seeds => new(Enumerable.Range(1, 12));

    [Theory]
    [MemberData(nameof(Seeds))]
    public void A_clean_launch_held_at_its_tyres_peak_is_valid_with_pulses_alone(int seed)
    {
        PrescribedRecordSpec standing = Records.Standing(seed);
        double slip = 0.10 + (0.01 * (seed % 11));
        PrescribedRecordSpec spec = PulsesOnly(standing with { Pickup = standing.Pickup with { Slip = LaunchSpinTests.AtThePeak(standing, slip, 3) } }, seed);

        AssertValid(spec, Analyse(spec));
    }

    /// <summary>A driveline shunt of 2.7–9.3 Hz, ±0.55–0.8 m/s², on a clean tyre whose slip
    /// follows the force (k 0.0055–0.008 s²/m): the wheel's speed swings with the car's, within
    /// the bounds (shunts of about 2–10 Hz and ±0.5–1.5 m/s² are common, from memory).</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(3)]
    [InlineData(5)]
    [InlineData(8)]
    [InlineData(11)]
    [InlineData(12)]
    public void A_shunted_clean_launch_is_valid_with_pulses_alone(int seed)
    {
        PrescribedRecordSpec standing = Records.Standing(seed);
        PrescribedRecordSpec spec = PulsesOnly(standing with
        {
            Shape = PrescribedShapes.ShuntedStart(4 + (seed % 4), 0.15, 0.5 + (0.025 * seed), 2.7 + (0.55 * seed), 5),
            Pickup = standing.Pickup with { Slip = new DriveSlip(PerMps2: 0.005 + (0.00025 * seed), LaunchPerMps2: 0) },
        }, seed);

        AssertValid(spec, Analyse(spec));
    }

    /// <summary>An undriven wheel the road spins up (<see cref="SpinUpLag"/>): it lags the car a little.</summary>
    [Theory]
    [InlineData(2)]
    [InlineData(7)]
    [InlineData(10)]
    public void An_undriven_wheel_spun_up_by_the_road_is_valid_with_pulses_alone(int seed)
    {
        PrescribedRecordSpec spec = PulsesOnly(Records.Standing(seed, spinUp: true), seed);

        AssertValid(spec, Analyse(spec));
    }

    /// <summary>A launch at 1.4 g from the first instant (a step; a closed form, x = a·t²/2), its
    /// tyre held at a slip of 0.2 throughout: as hard as a track tyre pulls, at its peak, is not
    /// spin. (The shape's pull stops at once at the quarter mile, where the slip's 0.2 of 105 m/s
    /// vanishes in an instant, a fall no wheel makes; the judge rightly calls that stop
    /// impossible, so only the launch is asked about here.)</summary>
    [Theory]
    [InlineData(3)]
    [InlineData(6)]
    public void A_launch_at_a_track_tyres_grip_held_at_its_peak_is_valid_with_pulses_alone(int seed)
    {
        const double a = 1.4 * 9.80665;
        PrescribedRecordSpec standing = Records.Standing(seed);
        PrescribedRecordSpec spec = PulsesOnly(standing with
        {
            Shape = PrescribedShapes.ConstantLaunch(a),
            Pickup = standing.Pickup with { Slip = new DriveSlip(PerMps2: 0.2 / a, LaunchPerMps2: 0) },
        }, seed);
        RunAnalysis run = Analyse(spec);

        Assert.Empty(run.Reconstruction.PulseSpinWindows);
        Assert.DoesNotContain(run.Verdict!.Reasons, r => r.Code == "wheelspin");
    }

    /// <summary>Spins the pulses alone show: after 0.43–0.86 s, a slip ratio of 0.57–0.97, held
    /// 0.07–0.28 s, on 8–100 teeth, edges or polls of 0.1–10 ms. What the data cannot show (the
    /// same draws, found none of them): a spin to a slip of 0.30–0.54 (its lead past the peak's
    /// 0.2 and the 0.05 a wheel may lag is under the windows' σ at the car's few m/s), and spins
    /// to 0.61–0.95 that begin before about 0.5 s, when the car moves at 1–2 m/s and a car
    /// pulling up to 1.5 g could gain the wheel's speed itself; the generator's early spins
    /// (<see cref="WheelSpin.Draw"/>, from 0–0.2 s) are not seen at all.</summary>
    public static TheoryData<int, double, double, double, double, double> Spins => new()
    {
        { 1, 0.86, 0.93, 0.05, 0.09, 0.06 },
        { 6, 0.84, 0.57, 0.08, 0.11, 0.06 },
        { 8, 0.54, 0.70, 0.02, 0.17, 0.06 },
        { 9, 0.64, 0.77, 0.08, 0.07, 0.06 },
        { 10, 0.73, 0.84, 0.05, 0.23, 0.06 },
        { 11, 0.83, 0.91, 0.02, 0.13, 0.06 },
        { 12, 0.43, 0.97, 0.08, 0.28, 0.06 },
        { 21, 0.81, 0.88, 0.08, 0.17, 0.06 },
    };

    [Theory]
    [MemberData(nameof(Spins))]
    public void A_spin_past_the_peak_seen_in_the_pulses_alone_makes_the_run_doubtful_for_wheelspin(int seed, double afterS, double slip, double riseS, double holdS, double fallS)
    {
        var spin = new WheelSpin(afterS, slip, riseS, holdS, fallS);
        PrescribedRecordSpec spec = PulsesOnly(LaunchSpinTests.Spun(seed, spin), seed);
        RunAnalysis run = Analyse(spec);

        Assert.NotEmpty(run.Reconstruction.PulseSpinWindows);
        VerdictReason reason = Assert.Single(run.Verdict!.Reasons, r => r.Code == "wheelspin");
        Assert.Equal(VerdictLevel.Doubtful, run.Verdict.Level);
        Assert.Contains("with pulses alone", reason.Text, StringComparison.Ordinal);

        // The window holds the spin: it reaches into the time the truth spun.
        double firstMotion = spec.Shape.Profile.Segments.First(s => !s.AtRest).StartS;
        Assert.Contains(run.Reconstruction.PulseSpinWindows, w => w.StartS < firstMotion + spin.EndsAfterS + 0.1 && w.EndS > firstMotion + afterS);
    }
}
