using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The pulses-alone spin bound on prescribed motions (<see cref="WindowScene"/>): a launch
/// at 4 m/s² (v = 4·t, a closed form), its wheel held at a slip of 0.2 — the most a tyre slips at
/// its grip peak (J. Y. Wong, "Theory of Ground Vehicles", ch. 1; from memory) — or running away
/// to twice the car's speed and back.</summary>
public class PulseSpinBoundTests
{
    private static readonly ReconstructionOptions Options = new();

    private static List<TimeWindow> Find(Func<double, double, double> wheel)
    {
        WindowScene scene = DriveForceWindowsTests.LaunchCoastStop(wheel);
        return PulseSpinBound.Find(scene.Pulses(), scene.MetresPerPulse, Options.ToothSpacingErrorFraction * scene.MetresPerPulse, 0, scene.EndS, Options, out _);
    }

    [Fact]
    public void A_wheel_held_at_its_tyres_peak_slip_breaks_no_bound()
    {
        Assert.Empty(Find((t, v) => 1.2 * v));
    }

    [Fact]
    public void A_wheel_that_runs_to_twice_the_cars_speed_and_back_is_found_where_it_ran()
    {
        // Prescribed: the wheel runs ahead by 4·sin²(π(t − 0.8)/0.4) m/s from 0.8 to 1.2 s: at
        // 1.0 s it turns at 8 m/s with the car at 4 (a slip of 1), and falls back to the car's
        // 4.8 m/s by 1.2 s — from 8 m/s a clean wheel (slip at most 0.2) rides a car at 6.67 m/s
        // or more, which without brakes (0.3 g) cannot be under 6 m/s a quarter second later.
        List<TimeWindow> found = Find((t, v) => t >= 0.8 && t <= 1.2 ? v + (4 * Math.Pow(Math.Sin(Math.PI * (t - 0.8) / 0.4), 2)) : v);

        Assert.NotEmpty(found);
        Assert.All(found, w => Assert.True(w.StartS >= 0.7 && w.EndS <= 1.35, $"spin window {w.StartS:F3}–{w.EndS:F3} s"));
        Assert.Contains(found, w => w.Contains(1.1));
    }
}
