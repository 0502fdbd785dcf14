using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

// Pulses only on a record that opens moving (a rolling start at 10–25 mph, then a pull to 80 mph),
// the pickup's wheel told driven: the tyre slips by its slip law κ = k·(a + c_d·v² + c_r) all
// through the pull (DriveSlip, the generator's, so independent of the decoder), and the decoder
// takes k's expected value off the speed and distance as on a standing start. The slip laws tried
// are real tyres' (k = share/(C·g0), C 15–30, a driven pair's share 1.4–2.3; Pacejka ch. 1 and
// Gillespie ch. 2, from memory; DriveSlipToldTests). There is no launch here: the record opens
// cruising, so no launch slip is expected or generated. Seeds 1–6 cover every ring; the tyre is
// calibrated, so what is left is the slip's.
public partial class PickupWheelToldTests
{
    private static readonly double[] RollingMph = [10, 20, 25];

    [Theory]
    [InlineData(0.0065, 2)]
    [InlineData(0.0087, 2)]
    [InlineData(0.0110, 2)]
    [InlineData(0.0047, 3)]
    [InlineData(0.0130, 3)]
    public void A_driven_wheel_said_keeps_a_rolling_starts_passing_times_covered(double k, double sigmas)
    {
        // Slip laws within a σ of a driven pair's centre (0.0087 ± 0.0022 s²/m) inside ±2σ on every
        // passing time; the range's ends inside ±3σ.
        foreach ((PrescribedRecordSpec spec, PrescribedRecord r) in RollingRecords(k))
        {
            foreach (FigureCheck c in RollingPassing(r, PickupWheel.Driven))
            {
                Assert.True(Math.Abs(c.Error!.Value) <= sigmas * c.Sigma!.Value, $"{spec}, k {k}: {c.Name} error {c.Error * 1e3:F2} ms, σ {c.Sigma * 1e3:F2} ms ({c.Error / c.Sigma:F2}σ)");
            }
        }
    }

    [Fact]
    public void A_driven_wheel_said_takes_its_drive_slip_off_a_rolling_starts_passing_times()
    {
        // At the centre of a driven pair's law the pulses read the speed fast by 2–4 %, so every
        // passing time comes out short when nothing is said (σ hides it: the not-said slip's
        // 0 ± 0.005 s²/m is in σ); said, the errors are centred and smaller. Measured on these 50
        // passing times: error/σ mean −0.42 not said, +0.05 said; rms error 129.0 → 15.9 ms.
        var said = new List<double>();
        var notSaid = new List<double>();
        var saidZ = new List<double>();
        var notSaidZ = new List<double>();
        foreach ((_, PrescribedRecord r) in RollingRecords(0.0087))
        {
            FigureCheck[] told = RollingPassing(r, PickupWheel.Driven).ToArray();
            FigureCheck[] untold = RollingPassing(r, null).ToArray();
            Assert.Equal(told.Select(c => c.Name), untold.Select(c => c.Name));
            said.AddRange(told.Select(c => c.Error!.Value));
            notSaid.AddRange(untold.Select(c => c.Error!.Value));
            saidZ.AddRange(told.Select(c => c.Error!.Value / c.Sigma!.Value));
            notSaidZ.AddRange(untold.Select(c => c.Error!.Value / c.Sigma!.Value));
        }

        static double Rms(List<double> x) => Math.Sqrt(x.Average(e => e * e));
        string detail = $"{said.Count} passing times; error/σ mean said {saidZ.Average():F2}, not said {notSaidZ.Average():F2}; rms error said {Rms(said) * 1e3:F1} ms, not said {Rms(notSaid) * 1e3:F1} ms";
        Assert.True(said.Count >= 30, detail);
        Assert.True(notSaidZ.Average() < -0.3, detail);
        Assert.True(Math.Abs(saidZ.Average()) <= 0.25, detail);
        Assert.True(Rms(said) < 0.25 * Rms(notSaid), detail);
    }

    /// <summary>Rolling starts at <see cref="RollingMph"/> on every seed, pulses only, the pickup
    /// on a driven wheel slipping by this class's law with slip per m/s² <paramref name="k"/>
    /// and no launch part.</summary>
    private static IEnumerable<(PrescribedRecordSpec Spec, PrescribedRecord Record)> RollingRecords(double k)
    {
        foreach (int seed in Seeds)
        {
            foreach (double mph in RollingMph)
            {
                PrescribedRecordSpec spec = PulsesOnly(seed) with { Shape = PrescribedShapes.RollingStart(mph * TruthUnits.MpsPerMph, new Random(seed + (int)mph)) };
                spec = spec with { Pickup = spec.Pickup with { Slip = Law(k) with { LaunchPerMps2 = 0 } } };
                yield return (spec, spec.Generate());
            }
        }
    }

    /// <summary>The passing times of a rolling start, every one the truth has, each reported.</summary>
    private static IEnumerable<FigureCheck> RollingPassing(PrescribedRecord r, PickupWheel? wheel)
    {
        TruthRun t = Assert.Single(r.Truth);
        RunAnalysis a = Analyse(r, wheel);
        Assert.False(a.Reconstruction.Staged);
        FigureSet f = a.Figures;
        FigureCheck[] checks = FigureChecks.Passing(f, t).ToArray();
        Assert.NotEmpty(checks);
        foreach (FigureCheck c in checks)
        {
            Assert.True(c.Error is not null && c.Sigma is not null, $"{r.Spec}: {c.Name} not reported");
        }

        return checks;
    }
}
