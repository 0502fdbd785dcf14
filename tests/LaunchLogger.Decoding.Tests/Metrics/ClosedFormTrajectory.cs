using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Metrics;

/// <summary>Exact trajectories from closed-form motions, for checking the figures code.</summary>
internal static class ClosedFormTrajectory
{
    /// <summary>Still until <paramref name="t0"/>, then constant acceleration
    /// (kinematics, any textbook: v = a·t, d = a·t²/2), sampled every <paramref name="stepS"/>.</summary>
    public static Trajectory ConstantAcceleration(double accelMps2, double t0, double endS, double stepS = 0.001, double sigmaDistanceM = 0, double sigmaSpeedMps = 0)
    {
        int n = (int)Math.Round(endS / stepS) + 1;
        var t = new double[n];
        var d = new double[n];
        var v = new double[n];
        var a = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i * stepS;
            double tau = Math.Max(0, t[i] - t0);
            a[i] = t[i] >= t0 ? accelMps2 : 0;
            v[i] = accelMps2 * tau;
            d[i] = 0.5 * accelMps2 * tau * tau;
        }

        return new Trajectory
        {
            TimeS = t,
            DistanceM = d,
            SpeedMps = v,
            AccelMps2 = a,
            DistanceSigmaM = sigmaDistanceM > 0 ? Enumerable.Repeat(sigmaDistanceM, n).ToArray() : null,
            SpeedSigmaMps = sigmaSpeedMps > 0 ? Enumerable.Repeat(sigmaSpeedMps, n).ToArray() : null,
        };
    }
    /// <summary>Still until <paramref name="t0"/>, then constant power per unit mass p with no
    /// drag or traction limit (½·v² = p·τ, any mechanics textbook): v = √(2·p·τ),
    /// d = (2/3)·√(2·p)·τ^(3/2), a = √(p/(2·τ)), sampled every <paramref name="stepS"/>.</summary>
    public static Trajectory ConstantPower(double powerPerMassWPerKg, double t0, double endS, double stepS = 0.001)
    {
        int n = (int)Math.Round(endS / stepS) + 1;
        var t = new double[n];
        var d = new double[n];
        var v = new double[n];
        var a = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i * stepS;
            double tau = Math.Max(0, t[i] - t0);
            v[i] = Math.Sqrt(2 * powerPerMassWPerKg * tau);
            d[i] = 2.0 / 3 * Math.Sqrt(2 * powerPerMassWPerKg) * Math.Pow(tau, 1.5);
            a[i] = tau > 0 ? Math.Sqrt(powerPerMassWPerKg / (2 * tau)) : 0;
        }

        return new Trajectory { TimeS = t, DistanceM = d, SpeedMps = v, AccelMps2 = a };
    }

    /// <summary>Time to reach <paramref name="distanceM"/> from rest at constant power per unit mass
    /// (the inverse of d = (2/3)·√(2·p)·τ^(3/2)).</summary>
    public static double ConstantPowerTimeToDistance(double powerPerMassWPerKg, double distanceM) =>
        Math.Pow(1.5 * distanceM / Math.Sqrt(2 * powerPerMassWPerKg), 2.0 / 3);

    /// <summary>Time to reach <paramref name="speedMps"/> from rest at constant power per unit mass (τ = v²/(2·p)).</summary>
    public static double ConstantPowerTimeToSpeed(double powerPerMassWPerKg, double speedMps) =>
        speedMps * speedMps / (2 * powerPerMassWPerKg);
}
