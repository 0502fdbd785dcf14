using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

// Pulses only on a standing start, the pickup's wheel told driven: past the launch a
// driven tyre keeps slipping by its slip law, κ = k·a (DriveSlip, the generator's,
// so independent of the decoder), and the decoder takes k's expected value off the distance and
// speed (ReconstructionOptions.DrivenSlip, ReconstructionOptions.AllWheelsDrivenSlip).
// The slip laws tried are those of real tyres, not the decoder's prior read back: k =
// share/(C·g0) with a car tyre's slip stiffness C of 15–30 per unit slip (H. B. Pacejka, "Tire and
// Vehicle Dynamics", ch. 1; from memory) and a driven pair's share of 1.4–2.3 (its axle's load
// while accelerating; T. D. Gillespie, "Fundamentals of Vehicle Dynamics", ch. 2; from memory),
// applied to the tyre's force (the car's acceleration, its drag and its rolling resistance):
// 0.0047 (C 30, share 1.4) to 0.0156 (C 15, share 2.3) s²/m; with all four wheels driven, share
// 0.8–1.2: 0.0027–0.0082 s²/m. Seeds 1–6 cover every ring of Records.Standing
// (8–100 teeth); the tyre is calibrated, so what is left is the slip's.
public partial class PickupWheelToldTests
{
    /// <summary>The slip follows the tyre's force, which also overcomes the air and the rolling
    /// resistance: ½·ρ·Cd·A / m for a 1,400 kg car with Cd·A 0.62 m² in air of 1.2 kg/m³, and a
    /// rolling coefficient of 0.010 (common practice; a car of our own, not the decoder's figures).</summary>
    private const double DragPerSpeedSquared = 0.5 * 1.2 * 0.62 / 1400;

    /// <summary>Rolling resistance per unit mass, m/s²: 0.010·g0.</summary>
    private const double RollingMps2 = 0.010 * 9.80665;

    [Theory]
    [InlineData(0.0065, 2)]
    [InlineData(0.0087, 2)]
    [InlineData(0.0110, 2)]
    [InlineData(0.0047, 3)]
    [InlineData(0.0130, 3)]
    public void A_driven_wheel_said_keeps_every_standing_figure_covered(double k, double sigmas)
    {
        // Slip laws within a σ of a driven pair's centre (0.0087 ± 0.0022 s²/m) inside ±2σ on every
        // standing figure; the ends of the range (C 30 with share 1.4; about C 15 with share 2)
        // inside ±3σ. A launch at a slip of 10 % (the peak of the force–slip curve) first.
        foreach (int seed in Seeds)
        {
            AssertStandingCovered(WithSlip(PulsesOnly(seed), Law(k), 0.10), PickupWheel.Driven, sigmas);
        }
    }

    [Fact]
    public void A_driven_wheel_said_takes_its_drive_slip_off_the_quarter_mile()
    {
        // What the slip does to the quarter mile's ET after the rollout and its trap speed: each
        // error less the same record's with no slip at all, decoded with nothing said (the start's
        // own kinematic read cancels).
        // At the centre of a driven pair's slip law the ET is early by tens of milliseconds and the
        // trap speed fast when nothing is said; said, both are unbiased to within a fifth of their σ.
        var saidEt = new List<double>();
        var notSaidEt = new List<double>();
        var saidTrap = new List<double>();
        var etSigma = new List<double>();
        var trapSigma = new List<double>();
        foreach (int seed in Seeds)
        {
            PrescribedRecordSpec spec = PulsesOnly(seed);
            (double et0, double trap0, _, _) = QuarterMile(spec.Generate(), null);
            PrescribedRecord r = WithSlip(spec, Law(0.0087), 0.10).Generate();
            (double et, double trap, double sEt, double sTrap) = QuarterMile(r, PickupWheel.Driven);
            (double etNotSaid, _, _, _) = QuarterMile(r, null);
            saidEt.Add(et - et0);
            saidTrap.Add(trap - trap0);
            notSaidEt.Add(etNotSaid - et0);
            etSigma.Add(sEt);
            trapSigma.Add(sTrap);
        }

        string detail = $"ET after rollout said {string.Join(", ", saidEt.Select(e => (e * 1e3).ToString("F1")))} ms (σ {etSigma.Average() * 1e3:F1}), not said {string.Join(", ", notSaidEt.Select(e => (e * 1e3).ToString("F1")))} ms; trap said {string.Join(", ", saidTrap.Select(e => e.ToString("F3")))} m/s (σ {trapSigma.Average():F3})";
        Assert.True(Math.Abs(saidEt.Average()) <= 0.2 * etSigma.Average(), detail);
        Assert.True(Math.Abs(saidTrap.Average()) <= 0.2 * trapSigma.Average(), detail);
        Assert.True(notSaidEt.Average() < -0.5 * etSigma.Average(), detail);
    }

    [Theory]
    [InlineData(0.0036, 2)]
    [InlineData(0.0047, 2)]
    [InlineData(0.0058, 2)]
    [InlineData(0.0027, 3)]
    [InlineData(0.0070, 3)]
    public void A_wheel_of_a_car_with_all_four_driven_is_covered_with_or_without_a_peak_launch(double k, double sigmas)
    {
        // All four driven: each tyre works at about half a driven pair's force over load, so a
        // launch need not reach its peak. Both a launch on the slip law alone and one at a 10 %
        // peak stay covered (the peak's slip is in σ, not moved), every standing figure.
        foreach (int seed in Seeds)
        {
            foreach (double launch in new[] { 0.0, 0.10 })
            {
                AssertStandingCovered(WithSlip(PulsesOnly(seed), Law(k), launch), PickupWheel.DrivenAllWheels, sigmas);
            }
        }
    }

    /// <summary>The slip law k·(a + c_d·v² + c_r) of this class's car.</summary>
    private static DriveSlip Law(double k) => new(PerMps2: k, DragPerSpeedSquared: DragPerSpeedSquared, RollingMps2: RollingMps2);

    /// <summary>Every standing figure of <paramref name="spec"/> but first motion, decoded with
    /// <paramref name="wheel"/> told, within <paramref name="sigmas"/> of its σ.</summary>
    private static void AssertStandingCovered(PrescribedRecordSpec spec, PickupWheel wheel, double sigmas)
    {
        PrescribedRecord r = spec.Generate();
        TruthRun t = Assert.Single(r.Truth);
        FigureSet f = Analyse(r, wheel).Figures;
        foreach (FigureCheck c in FigureChecks.Standing(f, t).Where(c => c.Error is not null && c.Name != "first motion"))
        {
            Assert.True(Math.Abs(c.Error!.Value) <= sigmas * c.Sigma!.Value, $"{spec}, {spec.Pickup.Slip}: {c.Name} error {c.Error:G4}, σ {c.Sigma:G4} (s, m/s) ({c.Error / c.Sigma:F2}σ)");
        }
    }

    /// <summary>The quarter mile's ET after the rollout and trap speed: their errors and σ.</summary>
    private static (double Et, double Trap, double EtSigma, double TrapSigma) QuarterMile(PrescribedRecord r, PickupWheel? wheel)
    {
        TruthRun t = Assert.Single(r.Truth);
        FigureSet f = Analyse(r, wheel).Figures;
        FigureCheck et = FigureChecks.Standing(f, t).Single(c => c.Name == "1320 ft after rollout");
        FigureCheck trap = FigureChecks.Standing(f, t).Single(c => c.Name == "1320 ft trap speed");
        return (et.Error!.Value, trap.Error!.Value, et.Sigma!.Value, trap.Sigma!.Value);
    }
}
