using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>Drive and brake windows read from the acceleration alone, on prescribed motions
/// whose phases start and end at known times. The windows average the input over ±0.05 s and
/// widen by 0.1 s (documented on <see cref="DriveForceWindows"/>), so each edge is checked
/// against the prescribed time plus that widening, within the averaging half-span.</summary>
public class DriveForceWindowsTests
{
    private const double AveragingHalfSpanS = 0.05;
    private const double WideningS = 0.1;

    private static readonly ReconstructionOptions Options = new();

    /// <summary>Launch at 4 m/s² for 3 s (to 12 m/s), coast 1 s, stop at 8 m/s² from 4.0 s to
    /// rest at 5.5 s (12 m/s ÷ 8 m/s² = 1.5 s; constant-acceleration kinematics).</summary>
    internal static WindowScene LaunchCoastStop(Func<double, double, double>? wheel = null) => new()
    {
        CarAccelMps2 = t => t < 0 ? 0 : t < 3 ? 4 : t < 4 ? 0 : t < 5.5 ? -8 : 0,
        WheelSpeedMps = wheel,
        EndS = 7,
        StopS = 5.5,
    };

    /// <summary>Launch as above, then a brake rise from 0 to 6 m/s² over 1 s from 4.0 s (the slow
    /// end of what drivers do) and a hold to rest: 12 − 3 = 9 m/s at 5.0 s, rest 1.5 s later.</summary>
    internal static WindowScene LaunchCoastSlowStop() => new()
    {
        CarAccelMps2 = t => t < 0 ? 0 : t < 3 ? 4 : t < 4 ? 0 : t < 5 ? -6 * (t - 4) : t < 6.5 ? -6 : 0,
        EndS = 8,
        StopS = 6.5,
    };

    [Fact]
    public void AFirmStopIsOneWindowFromItsStartToTheStop()
    {
        var windows = new DriveForceWindows(LaunchCoastStop().Grid(), Options);

        List<TimeWindow> braking = windows.BrakingWindows(0, 5.5, Options.BrakingDecelMps2, 0);

        // Prescribed: the brakes act from 4.0 s to the stop at 5.5 s (common practice: a brake
        // window is where the deceleration is, widened for the slip building with the pressure).
        TimeWindow w = Assert.Single(braking);
        Assert.InRange(w.StartS, 4.0 - WideningS - AveragingHalfSpanS, 4.0 - WideningS + AveragingHalfSpanS);
        Assert.Equal(5.5, w.EndS, 9);
    }

    [Fact]
    public void TheDriveIsOneWindowFromFirstMotionToTheLiftOff()
    {
        var windows = new DriveForceWindows(LaunchCoastStop().Grid(), Options);

        List<TimeWindow> drive = windows.DriveWindows(0, 5.5);

        // Prescribed: drive from first motion (0 s) to the lift-off at 3.0 s; coasting and
        // braking are no drive.
        TimeWindow w = Assert.Single(drive);
        Assert.Equal(0, w.StartS, 9);
        Assert.InRange(w.EndS, 3.0 + WideningS - AveragingHalfSpanS, 3.0 + WideningS + AveragingHalfSpanS);
    }

    [Fact]
    public void TwoBrakeApplicationsApartAreTwoWindowsAndAShortReleaseIsOne()
    {
        // From 20 m/s: 6 m/s² for 1 s, released for `gap` s, 6 m/s² for 1 s (20 − 12 = 8 m/s left).
        static WindowScene TwoPresses(double gap) => new()
        {
            CarAccelMps2 = t => t < 0 ? 0 : t < 5 ? 4 : t < 6 ? 0 : t < 7 ? -6 : t < 7 + gap ? 0 : t < 8 + gap ? -6 : 0,
            EndS = 10,
        };

        List<TimeWindow> apart = new DriveForceWindows(TwoPresses(0.6).Grid(), Options).BrakingWindows(0, null, Options.BrakingDecelMps2, 0);
        List<TimeWindow> joined = new DriveForceWindows(TwoPresses(0.05).Grid(), Options).BrakingWindows(0, null, Options.BrakingDecelMps2, 0);

        // Common practice: a pedal let up for a moment is one stop, let up for longer two.
        Assert.Equal(2, apart.Count);
        Assert.InRange(apart[1].StartS, 7.6 - WideningS - AveragingHalfSpanS, 7.6 - WideningS + AveragingHalfSpanS);
        TimeWindow one = Assert.Single(joined);
        Assert.InRange(one.EndS, 8.05 + WideningS - AveragingHalfSpanS, 8.05 + WideningS + AveragingHalfSpanS);
    }

    [Fact]
    public void FirmBrakingOpensAtTheFootOfASlowRise()
    {
        var windows = new DriveForceWindows(LaunchCoastSlowStop().Grid(), Options);

        TimeWindow plain = Assert.Single(windows.BrakingWindows(0, 6.5, Options.BrakingDecelMps2, 0));
        TimeWindow firm = Assert.Single(windows.FirmBraking(0, 6.5, 0));

        // Prescribed: the rise begins at 4.0 s. A braked tyre slips from the first touch of the
        // pedal, by deceleration over its longitudinal stiffness (H. B. Pacejka, "Tire and Vehicle
        // Dynamics", ch. 1), so the firm window holds the whole rise: it opens at or before its
        // foot, and by no more than the averaging span and one 0.1-s step of the walk back.
        Assert.InRange(firm.StartS, 4.0 - AveragingHalfSpanS - 0.1, 4.0);
        Assert.Equal(6.5, firm.EndS, 9);

        // The threshold alone (1.5 m/s² net of drag) is crossed a quarter of the way up the rise.
        Assert.True(plain.StartS > 4.1, $"plain window opened at {plain.StartS:F3} s");
    }

    [Fact]
    public void BrakeStepVarianceIsTheScaleErrorOnTheMeanDecelerationAndThePitchStep()
    {
        var windows = new DriveForceWindows(LaunchCoastStop().Grid(), Options);
        var window = new TimeWindow(4.0, 5.5);

        double[] withScale = windows.BrakeStepVariances([window], withScale: true);
        double[] without = windows.BrakeStepVariances([window], withScale: false);

        // A scale-factor error multiplies the reading (IEEE Std 1293 accelerometer model, from
        // memory), so over the stop it is σ_scale × the mean deceleration, 12 m/s ÷ 1.5 s (prescribed).
        double scale = Options.AccelScaleSigma * (12.0 / 1.5);
        double step = Options.BrakeBiasStepSigmaMps2 * Options.BrakeBiasStepSigmaMps2;
        Assert.Equal((scale * scale) + step, withScale[0], 1e-4);
        Assert.Equal(step, without[0], 12);
    }
}
