using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Ready-made record specs for decoder tests: a seed picks the pickup (8–100 teeth),
/// the tyre, the accelerometer's rate (100–1600 Hz), bias, tilt and clock drift, and, when asked,
/// the undriven wheel's spin-up lag (<see cref="SpinUpLag.Draw"/>; without it the wheel has no
/// inertia and <see cref="DecoderHarness"/> tells the decoder so). Vary one part
/// with <c>with { … }</c> (Polled, Shape, Accel = null, Pickup with an uncalibrated tyre…).</summary>
public static class Records
{
    /// <summary>A standing start drawn from <paramref name="seed"/>; the launch and brake rise
    /// times may be fixed (0 = a step).</summary>
    public static PrescribedRecordSpec Standing(int seed, double? launchRiseS = null, double? brakeRiseS = null, bool spinUp = false) => new()
    {
        Shape = PrescribedShapes.StandingStart(new Random(seed), launchRiseS: launchRiseS, brakeRiseS: brakeRiseS),
        Pickup = new WheelPickup(new[] { 8, 12, 24, 48, 60, 100 }[seed % 6], TyreModel.Calibrated(1.9 + (0.02 * seed)), 0.1 * (seed % 10), SpinUp: spinUp ? SpinUpLag.Draw(new Random(seed), 1.9 + (0.02 * seed)) : null),
        Accel = new AccelSensor
        {
            RateHz = new[] { 100, 200, 400, 800, 1600 }[seed % 5],
            NoiseMicroGPerRootHz = 150,
            BiasXMps2 = 0.02 * ((seed % 5) - 2),
            PitchRad = 0.01 * ((seed % 7) - 3),
            ClockDriftPpm = 50 * ((seed % 5) - 2),
        },
        Seed = seed,
    };
}
