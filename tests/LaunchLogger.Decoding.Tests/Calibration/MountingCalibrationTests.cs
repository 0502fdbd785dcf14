using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Calibration;

public class MountingCalibrationTests
{
    private const double G0 = CalibrationRuns.G0;
    private const double Noise = 0.04;
    private static readonly double Degree = Math.PI / 180;

    /// <summary>The resting specific force of a box pitched nose up by <paramref name="pitchRad"/>
    /// and rolled left side up by <paramref name="rollRad"/>: the reaction to gravity, g straight
    /// up, seen in the box's axes (definition of specific force; rotation about y, then x).</summary>
    private static (double F, double L, double U) Rest(double pitchRad, double rollRad, double magnitude = G0) =>
        (magnitude * Math.Sin(pitchRad), magnitude * Math.Cos(pitchRad) * Math.Sin(rollRad), magnitude * Math.Cos(pitchRad) * Math.Cos(rollRad));

    [Fact]
    public void LevelRestGivesAsinOfTheForwardReadingOverTheMagnitude()
    {
        // A 2° tilt plus a 40 milli-g forward offset, read on a 1.02 g vector (z offset and scale).
        (double f, double l, double u) = Rest(2 * Degree, -1 * Degree, 1.02 * G0);
        f += 0.040 * G0;
        DecodedRun run = CalibrationRuns.Launch((f, l, u), noiseMps2: Noise);

        MountingEstimate m = MountingCalibration.FromLevelRest(run);

        double magnitude = Math.Sqrt((f * f) + (l * l) + (u * u));
        double expected = Math.Asin(f / magnitude);
        RestReading rest = Assert.Single(m.Rests);
        Assert.False(m.TwoWay);
        Assert.Null(m.GradeRad);
        Assert.InRange(rest.Samples, 1800, 2000);

        // The mean of n samples with white noise σ has σ/√n (any statistics text).
        double closedFormSigma = Noise / Math.Sqrt(rest.Samples) / (magnitude * Math.Cos(expected));
        Assert.InRange(m.PitchRad.Sigma, 0.8 * closedFormSigma, 1.3 * closedFormSigma);
        Assert.True(Math.Abs(m.PitchRad.Value - expected) < 4 * m.PitchRad.Sigma, $"{m.PitchRad.Value / Degree:F4}° against {expected / Degree:F4}°");
        Assert.Equal(Math.Atan2(l, u), m.RollRad.Value, 3);
    }

    [Fact]
    public void MountingPitchIsTheQuantityTheReconstructionCallsRestingPitch()
    {
        // On level ground the grade estimate subtracts one from the other and must get zero.
        DecodedRun run = CalibrationRuns.Launch(Rest(1.5 * Degree, 0.5 * Degree), noiseMps2: Noise, seed: 4);

        MountingEstimate m = MountingCalibration.FromLevelRest(run);
        ReconstructedRun rebuilt = Reconstructor.Reconstruct(run);

        Estimate resting = rebuilt.RestingPitchRad!.Value;
        double sigma = Math.Sqrt((m.PitchRad.Sigma * m.PitchRad.Sigma) + (resting.Sigma * resting.Sigma));
        Assert.True(Math.Abs(m.PitchRad.Value - resting.Value) < 3 * sigma, $"{m.PitchRad.Value / Degree:F4}° against {resting.Value / Degree:F4}°");
    }

    [Theory]
    [InlineData("turned 2.5° left", 2.5)]
    [InlineData("turned 3° right", -3.0)]
    [InlineData("square", 0.0)]
    public void StraightAccelerationGivesTheYaw(string name, double yawDeg)
    {
        _ = name;
        DecodedRun run = CalibrationRuns.Launch(Rest(1 * Degree, 0.7 * Degree), yawRad: yawDeg * Degree, noiseMps2: Noise, seed: 2);

        MountingEstimate m = MountingCalibration.FromLevelRest(run);

        // Plane geometry: the change from rest is a·(cos ψ, −sin ψ) for a box turned ψ left.
        Estimate yaw = m.YawRad!.Value;
        Assert.True(Math.Abs(yaw.Value - (yawDeg * Degree)) < 3 * yaw.Sigma, $"{yaw.Value / Degree:F4}° ± {yaw.Sigma / Degree:F4}°");
        Assert.True(yaw.Sigma < 0.1 * Degree);
        YawReading reading = Assert.Single(m.Yaws);
        Assert.InRange(reading.Samples, 4000, 5000);
        Assert.Equal(3.0, reading.MeanForwardMps2, 1);
    }

    [Fact]
    public void WithoutAFirmAccelerationTheYawIsNotMeasured()
    {
        DecodedRun run = CalibrationRuns.Launch(Rest(1 * Degree, 0), accelMps2: 0.5, noiseMps2: Noise);

        MountingEstimate m = MountingCalibration.FromLevelRest(run);

        Assert.Null(m.YawRad);
        Assert.Empty(m.Yaws);
        Assert.Contains(m.Warnings, w => w.Contains("yaw was not measured", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("1.5° mounting on a 2 % slope", 1.5, 2.0)]
    [InlineData("−0.8° mounting on a 5 % slope the other way", -0.8, -5.0)]
    [InlineData("level spot", 2.0, 0.0)]
    public void TwoOppositeRestsSeparateMountingFromSlope(string name, double mountDeg, double gradePercent)
    {
        _ = name;
        double mount = mountDeg * Degree;
        double slope = Math.Atan(gradePercent / 100);

        // calibration.md §3: facing one way the box reads mounting + slope, the other way mounting − slope.
        DecodedRun a = CalibrationRuns.Launch(Rest(mount + slope, 0.4 * Degree), yawRad: 1 * Degree, noiseMps2: Noise, seed: 11, source: "a.log run 1");
        DecodedRun b = CalibrationRuns.Launch(Rest(mount - slope, 0.4 * Degree), yawRad: 1 * Degree, noiseMps2: Noise, seed: 12, source: "b.log run 1");

        MountingEstimate m = MountingCalibration.FromOppositeRests(a, b);

        Assert.True(m.TwoWay);
        Assert.True(Math.Abs(m.PitchRad.Value - mount) < 4 * m.PitchRad.Sigma, $"mounting {m.PitchRad.Value / Degree:F4}°");
        Assert.True(Math.Abs(m.GradeRad!.Value.Value - slope) < 4 * m.GradeRad.Value.Sigma, $"slope {m.GradeRad.Value.Value / Degree:F4}°");
        Assert.Equal(gradePercent, m.GradePercent!.Value, 1);
        Assert.Equal(2, m.Yaws.Count);
        Assert.True(Math.Abs(m.YawRad!.Value.Value - (1 * Degree)) < 3 * m.YawRad.Value.Sigma);
        Assert.Equal(0.5 * Math.Sqrt((m.Rests[0].PitchRad.Sigma * m.Rests[0].PitchRad.Sigma) + (m.Rests[1].PitchRad.Sigma * m.Rests[1].PitchRad.Sigma)), m.PitchRad.Sigma, 12);
    }

    [Fact]
    public void ARunThatOpenedWhileRollingHasNoRest()
    {
        DecodedRun run = CalibrationRuns.Launch(Rest(1 * Degree, 0), staged: false);

        var e = Assert.Throws<CalibrationException>(() => MountingCalibration.FromLevelRest(run));

        Assert.Contains("opened while rolling", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ARunWithoutAnAccelerometerIsRefused()
    {
        DecodedRun withAccel = CalibrationRuns.Launch(Rest(1 * Degree, 0));
        var run = new DecodedRun { Source = withAccel.Source, Configuration = withAccel.Configuration, Pulses = withAccel.Pulses, Complete = true };

        Assert.Throws<CalibrationException>(() => MountingCalibration.FromLevelRest(run));
    }
}
