namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>Sample noise and engine vibration for <see cref="ScriptedRun.AccelModifier"/>.</summary>
public static class AccelShaker
{
    /// <summary>Adds white Gaussian noise of <paramref name="sigmaMilliG"/> to every axis and a
    /// vibration of <paramref name="hz"/> with the given amplitudes (mg) to x, y and z (y and z a
    /// radian and two behind x), rounded to whole mg as the sensor reports them.</summary>
    public static Func<long, AccelSample, AccelSample> Make(int seed, double sigmaMilliG, double x, double y, double z, double hz = 30, double phaseRad = 0)
    {
        var random = new Random(seed);
        double Gaussian() => Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
        return (t, s) =>
        {
            double phase = (2 * Math.PI * hz * t / 1e6) + phaseRad;
            return new AccelSample(
                (short)Math.Round(s.X + (x * Math.Sin(phase)) + (sigmaMilliG * Gaussian())),
                (short)Math.Round(s.Y + (y * Math.Sin(phase + 1.0)) + (sigmaMilliG * Gaussian())),
                (short)Math.Round(s.Z + (z * Math.Sin(phase + 2.0)) + (sigmaMilliG * Gaussian())));
        };
    }
}
