using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Calibration;
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

    /// <summary>σ of the accelerometer scale's calibration against gravity, a fraction.</summary>
    public const double AccelCalibrationSigma = 0.002;

    /// <summary><paramref name="spec"/> with an uncalibrated tyre — rolling on a circumference
    /// <paramref name="ratioFrom"/> to <paramref name="ratioFrom"/> + <paramref name="ratioSpan"/>
    /// times the one told, growing by 0.1–0.6 % at 30 m/s — and an accelerometer 1 % σ off in
    /// scale, told to <see cref="AccelCalibrationSigma"/> as a calibration against gravity gives
    /// it: the spec, the options that tell the calibration, and the true rolling/told ratio.</summary>
    public static (PrescribedRecordSpec Spec, AnalysisOptions Options, double Truth) OffScaleTyre(PrescribedRecordSpec spec, Random random, double ratioFrom = 0.98, double ratioSpan = 0.02)
    {
        ArgumentNullException.ThrowIfNull(spec);
        ArgumentNullException.ThrowIfNull(random);
        double rolling = spec.Pickup.Tyre.RollingAtRestM;
        double ratio = ratioFrom + (ratioSpan * random.NextDouble());
        double growth = 0.001 + (0.005 * random.NextDouble());
        double scaleError = 0.01 * Gaussian(random);
        double told = 1 + scaleError + (AccelCalibrationSigma * Gaussian(random));
        PrescribedRecordSpec drawn = spec with
        {
            Pickup = spec.Pickup with { Tyre = new TyreModel(rolling / ratio, rolling, growth) },
            Accel = spec.Accel! with { ScaleError = scaleError },
        };
        var options = new AnalysisOptions { Calibration = new CalibrationSettings { AccelForwardScale = told, AccelForwardScaleSigma = AccelCalibrationSigma } };
        return (drawn, options, ratio);
    }

    // Box–Muller (G. E. P. Box, M. E. Muller, 1958).
    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
