using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Reference;

/// <summary>The firmware's on-board rollout mark against the closed form for constant
/// acceleration from rest (d = a·t²/2, any kinematics textbook): at 0.5 g the first foot takes
/// 0.35260 s (shared/REFERENCES.md, "Kinematics").</summary>
public class RolloutClosedFormTests
{
    private const double Foot = 0.3048; // m, exact (international yard and pound agreement, 1959)
    private const double Accel = 0.5 * MotionProfile.G0;

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void RolloutMarkMatchesTheClosedFormWithin48ToothInterpolationError(bool accelerometer)
    {
        var settings = new LoggerSettings { AccelPresent = accelerometer };
        Assert.Equal(48, settings.PulsesPerRevolution);
        Assert.Equal(304_800, settings.RolloutMicrometres);
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        const double launchS = 2.0004;
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(launchS, Accel));
        run.RunUntil(3_000_000);

        EventFrame rollout = sink.Frames.SingleEvent(EventKind.Rollout);
        Assert.Equal(recorder.RolloutMicros, rollout.TimeMicros);
        double markS = (rollout.TimeMicros / 1e6) - launchS;
        const double exactS = 0.35260; // shared/REFERENCES.md: 1 ft at 0.5 g from rest, t = √(2d/a)

        // The firmware interpolates time linearly in distance between the observations on either
        // side of 1 ft: with 48 teeth on 1.96 m those are edges 7 and 8, h = 40.83 mm apart.
        double h = run.MetresPerPulse(0);
        long k = (long)Math.Floor(Foot / h);
        double dk = k * h;

        // t(d) = sqrt(2d/a) is concave, so the chord lies below it and the mark comes early, by at
        // most h²/8 · max|t''| (error bound of linear interpolation, numerical analysis texts such as
        // Burden & Faires §3.1; from memory), |t''(d)| = ¼·sqrt(2/a)·d^(-3/2),
        // largest at d_k. Here about 0.22 ms. Add 2 µs for whole-microsecond brackets (midpoint
        // ceil(e) − 1) and the integer division.
        double curvature = 0.25 * Math.Sqrt(2 / Accel) * Math.Pow(dk, -1.5);
        double interpolationBoundS = h * h / 8 * curvature;
        const double quantisationS = 2e-6;
        Assert.InRange(markS, exactS - interpolationBoundS - quantisationS, exactS + quantisationS);

        // Tighter: the mark is the chord itself, computed from the true edge times.
        double tk = Math.Sqrt(2 * dk / Accel), tk1 = Math.Sqrt(2 * (dk + h) / Accel);
        double chordS = tk + ((tk1 - tk) * (Foot - dk) / h);
        Assert.InRange(markS, chordS - quantisationS, chordS + quantisationS);

        // Speed at the mark: mean speed over the bracketing edges, h/(t_k+1 − t_k), which for
        // constant acceleration equals a·(t_k + t_k+1)/2 (mean value of v = a·t), in mm/s,
        // truncated by the firmware.
        double chordSpeedMmPerS = SpeedMidway(tk, tk1) * 1000;
        Assert.InRange(rollout.SpeedMillimetresPerSecond!.Value, chordSpeedMmPerS - 1.5, chordSpeedMmPerS + 0.5);

        static double SpeedMidway(double t0, double t1) => Accel * (t0 + t1) / 2;
    }
}
