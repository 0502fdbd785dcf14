using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The windows stage on prescribed motions written straight into its inputs
/// (<see cref="WindowScene"/>): a launch, a coast and a stop, with a wheel that rolls with the
/// road, spins ahead for a moment, slides under braking, or slips as a braked tyre does.</summary>
public class WheelWindowFinderTests
{
    private static readonly ReconstructionOptions Options = new();

    [Fact]
    public void AWheelThatRollsWithTheRoadHasNoSpinAndNoSlide()
    {
        WheelWindows found = WheelWindowFinder.Find(DriveForceWindowsTests.LaunchCoastStop().Inputs(Options));

        Assert.Empty(found.Spin);
        Assert.Empty(found.SpinWarnings);
        Assert.Empty(found.Slides);

        // The stop from 4.0 s to rest at 5.5 s is firm braking whose pulses are kept.
        TimeWindow firm = Assert.Single(found.FirmBraking);
        Assert.True(firm.StartS <= 4.0 && firm.EndS >= 5.5 - 1e-9, $"firm braking {firm.StartS:F3}–{firm.EndS:F3} s");
        Assert.NotNull(found.DriveSlipSignal);
        Assert.NotNull(found.BrakeSlipSignal);
    }

    [Fact]
    public void AWheelspinBurstIsFoundWhereItWas()
    {
        // The driven wheel runs up to 2.5 m/s ahead of the car (about 4–6 m/s then, 40–60 %)
        // as a raised cosine from 1.0 to 1.5 s.
        WindowScene scene = DriveForceWindowsTests.LaunchCoastStop(
            (t, v) => t >= 1.0 && t <= 1.5 ? v + (2.5 * Square(Math.Sin(Math.PI * (t - 1.0) / 0.5))) : v);

        WheelWindows found = WheelWindowFinder.Find(scene.Inputs(Options));

        // Prescribed: the spin lasts from 1.0 to 1.5 s; a window of pulses (about 40 ms) either
        // side may be caught with it.
        Assert.NotEmpty(found.Spin);
        Assert.All(found.Spin, w => Assert.True(w.StartS >= 0.9 && w.EndS <= 1.6, $"spin window {w.StartS:F3}–{w.EndS:F3} s"));
        Assert.Contains(found.Spin, w => w.Contains(1.25));
        string note = Assert.Single(found.SpinWarnings);
        Assert.StartsWith("wheelspin suspected", note, StringComparison.Ordinal);
        Assert.Empty(found.Slides);
    }

    [Fact]
    public void ASlideUnderBrakingIsFoundAndItsPulsesAreNotKept()
    {
        // The wheel turns 20 % slower than the car moves from 4.6 to 5.2 s of the stop (4.0–5.5 s).
        WindowScene scene = DriveForceWindowsTests.LaunchCoastStop((t, v) => t >= 4.6 && t < 5.2 ? 0.8 * v : v);

        WheelWindows found = WheelWindowFinder.Find(scene.Inputs(Options));

        // Prescribed: a 20 % slide inside the stop. It began within a second of the brakes
        // biting, so the whole brake window is set aside (documented on the finder).
        TimeWindow slide = Assert.Single(found.Slides);
        Assert.True(slide.StartS <= 4.6 && slide.EndS >= 5.2, $"slide window {slide.StartS:F3}–{slide.EndS:F3} s");
        Assert.InRange(slide.StartS, 3.85, 4.0);
        Assert.InRange(found.LargestBehindFraction, 0.17, 0.23);

        // The firm window overlaps the slide, so its pulses are not kept for the brake slip fit.
        Assert.Empty(found.FirmBraking);
        Assert.Empty(found.Spin);
    }

    [Fact]
    public void TheDriveSlipSignalIsTheKineticEnergyGainedUnderDrive()
    {
        // With drag and rolling resistance left out, S(t) = ∫ v·max(a, 0) dt = ∫ v dv over the
        // drive, v²/2 (work–energy theorem): 12²/2 = 72 m²/s² at the lift-off, unchanged while
        // coasting and braking (no drive).
        ReconstructionOptions options = Options with { DragPerMassPerSpeedSquared = 0, RollingResistance = 0 };
        WindowScene scene = DriveForceWindowsTests.LaunchCoastStop();

        WheelWindows found = WheelWindowFinder.Find(scene.Inputs(options));

        double[] grid = scene.Grid().TimeS;
        double[] signal = found.DriveSlipSignal!;
        Assert.Equal(72, signal[IndexAt(grid, 3.5)], 0.02 * 72);
        Assert.Equal(signal[IndexAt(grid, 3.5)], signal[^1], 1e-9);
    }

    [Fact]
    public void TheBrakeSlipSignalIsTheKineticEnergyLostUnderBraking()
    {
        // A braked tyre of stiffness C turns slower than the road by a/(g0·C) (H. B. Pacejka,
        // "Tire and Vehicle Dynamics", ch. 1); told that C, the signal reads the car's speed back
        // from the wheel's, and S_b = ∫ v·max(−a, 0) dt over the stop is v²/2 = 72 m²/s²
        // (work–energy theorem), none of it before the brakes.
        const double Stiffness = 20;
        const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)
        ReconstructionOptions options = Options with { BrakeSlip = new BrakeSlipPrior(Stiffness, Stiffness) };
        WindowScene scene = DriveForceWindowsTests.LaunchCoastStop((t, v) => t >= 4.0 && t < 5.5 ? v * (1 - (8 / (G0 * Stiffness))) : v);

        WheelWindows found = WheelWindowFinder.Find(scene.Inputs(options));

        double[] grid = scene.Grid().TimeS;
        double[] signal = found.BrakeSlipSignal!;
        Assert.Equal(0, signal[IndexAt(grid, 3.8)], 9);
        Assert.Equal(72, signal[^1], 0.02 * 72);
    }

    [Fact]
    public void WithoutAnAccelerometerThereAreNoWindowsAndNoSignals()
    {
        WheelWindowInputs inputs = DriveForceWindowsTests.LaunchCoastStop().Inputs(Options);

        WheelWindows found = WheelWindowFinder.Find(new WheelWindowInputs
        {
            Steps = inputs.Steps,
            Pulses = inputs.Pulses,
            MetresPerPulse = inputs.MetresPerPulse,
            Staged = true,
            StartS = inputs.StartS,
            StopS = inputs.StopS,
            EndS = inputs.EndS,
            Options = Options,
        });

        // Nothing to set the pulses against: they are the only measure of the car.
        Assert.Empty(found.Spin);
        Assert.Empty(found.Slides);
        Assert.Empty(found.FirmBraking);
        Assert.Null(found.DriveSlipSignal);
        Assert.Null(found.BrakeSlipSignal);
    }

    private static int IndexAt(double[] grid, double timeS) => FusionSmoother.FirstIndexAfter(grid, timeS);

    private static double Square(double x) => x * x;
}
