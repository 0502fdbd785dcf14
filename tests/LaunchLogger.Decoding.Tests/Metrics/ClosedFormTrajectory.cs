using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Metrics;

/// <summary>Exact trajectories from closed-form motions, for checking the figures code.</summary>
internal static class ClosedFormTrajectory
{
    /// <summary>Still until <paramref name="t0"/>, then constant acceleration
    /// (kinematics, any textbook: v = a·t, d = a·t²/2), sampled every <paramref name="stepS"/>.</summary>
    public static Trajectory ConstantAcceleration(double accelMps2, double t0, double endS, double stepS = 0.001, double sigmaDistanceM = 0, double sigmaSpeedMps = 0)
    {
        Trajectory exact = Sample(t0, endS, stepS, tau => (0.5 * accelMps2 * tau * tau, accelMps2 * tau, accelMps2));
        int n = exact.TimeS.Length;
        return new Trajectory
        {
            TimeS = exact.TimeS,
            DistanceM = exact.DistanceM,
            SpeedMps = exact.SpeedMps,
            AccelMps2 = exact.AccelMps2,
            DistanceSigmaM = sigmaDistanceM > 0 ? Enumerable.Repeat(sigmaDistanceM, n).ToArray() : null,
            SpeedSigmaMps = sigmaSpeedMps > 0 ? Enumerable.Repeat(sigmaSpeedMps, n).ToArray() : null,
        };
    }

    /// <summary>Still until <paramref name="t0"/>, then constant power per unit mass p with no
    /// drag or traction limit (½·v² = p·τ, any mechanics textbook): v = √(2·p·τ),
    /// d = (2/3)·√(2·p)·τ^(3/2), a = √(p/(2·τ)), sampled every <paramref name="stepS"/>.</summary>
    public static Trajectory ConstantPower(double powerPerMassWPerKg, double t0, double endS, double stepS = 0.001) =>
        Sample(t0, endS, stepS, tau => (
            2.0 / 3 * Math.Sqrt(2 * powerPerMassWPerKg) * Math.Pow(tau, 1.5),
            Math.Sqrt(2 * powerPerMassWPerKg * tau),
            tau > 0 ? Math.Sqrt(powerPerMassWPerKg / (2 * tau)) : 0));

    /// <summary>A motion given as (distance, speed, acceleration) against the time τ since
    /// <paramref name="t0"/>, sampled every <paramref name="stepS"/> from 0 to
    /// <paramref name="endS"/>; before <paramref name="t0"/> the car stands still.</summary>
    private static Trajectory Sample(double t0, double endS, double stepS, Func<double, (double D, double V, double A)> motion)
    {
        int n = (int)Math.Round(endS / stepS) + 1;
        var t = new double[n];
        var d = new double[n];
        var v = new double[n];
        var a = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i * stepS;
            (d[i], v[i], a[i]) = motion(Math.Max(0, t[i] - t0));
            if (t[i] < t0)
            {
                a[i] = 0;
            }
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

    /// <summary>Cruise at <paramref name="v0"/> until <paramref name="brakeAtS"/>, then the
    /// <paramref name="phases"/> in turn (the last one lasts until the car stands), then standing
    /// for 1 s, or the whole thing cut at <paramref name="endS"/>. Each phase is closed form
    /// (constant jerk j from its opening deceleration; kinematics, any textbook):
    /// a(s) = a₀ + j·s, v(s) = v₀ + a₀·s + j·s²/2, d(s) = d₀ + v₀·s + a₀·s²/2 + j·s³/6; the car
    /// stands at the first root of v(s) = 0. Sampled every 0.5 ms.</summary>
    public static Trajectory Stop(double v0, double brakeAtS, StopPhase[] phases, double? endS = null)
    {
        const double Step = 0.0005;
        var starts = new List<(double T, double D, double V, double A, double J, double Length)>();
        double time = brakeAtS, dist = v0 * brakeAtS, speed = v0;
        double stopT = double.NaN;
        for (int p = 0; p < phases.Length && double.IsNaN(stopT); p++)
        {
            double a0 = -phases[p].OpeningDecelMps2, j = -phases[p].DecelRiseMps3;
            double length = p == phases.Length - 1 ? double.PositiveInfinity : phases[p].LengthS;
            double toStop = FirstStop(speed, a0, j);
            if (toStop <= length)
            {
                length = toStop;
                stopT = time + toStop;
            }

            starts.Add((time, dist, speed, a0, j, length));
            dist += (speed * length) + (a0 * length * length / 2) + (j * length * length * length / 6);
            speed = stopT > 0 ? 0 : speed + (a0 * length) + (j * length * length / 2);
            time += length;
        }

        double end = endS ?? (stopT + 1);
        int n = (int)(end / Step) + 1;
        var t = new double[n];
        var d = new double[n];
        var v = new double[n];
        var a = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i * Step;
            if (t[i] < brakeAtS)
            {
                (d[i], v[i], a[i]) = (v0 * t[i], v0, 0);
            }
            else if (t[i] >= stopT)
            {
                (d[i], v[i], a[i]) = (dist, 0, 0);
            }
            else
            {
                var ph = starts.Last(x => x.T <= t[i]);
                double s = t[i] - ph.T;
                d[i] = ph.D + (ph.V * s) + (ph.A * s * s / 2) + (ph.J * s * s * s / 6);
                v[i] = ph.V + (ph.A * s) + (ph.J * s * s / 2);
                a[i] = ph.A + (ph.J * s);
            }
        }

        return new Trajectory { TimeS = t, DistanceM = d, SpeedMps = v, AccelMps2 = a };
    }

    /// <summary>The first s &gt; 0 with v + a·s + j·s²/2 = 0 (quadratic formula), or ∞.</summary>
    private static double FirstStop(double v, double a, double j)
    {
        if (j == 0)
        {
            return a < 0 ? -v / a : double.PositiveInfinity;
        }

        double discriminant = (a * a) - (2 * j * v);
        if (discriminant < 0)
        {
            return double.PositiveInfinity;
        }

        double root = Math.Sqrt(discriminant);
        double[] roots = [(-a - root) / j, (-a + root) / j];
        return roots.Where(r => r > 0).DefaultIfEmpty(double.PositiveInfinity).Min();
    }
}

/// <summary>One phase of a closed-form stop: the deceleration it opens with, how fast that
/// deceleration rises (m/s³) and how long it lasts (ignored for the last phase).</summary>
internal readonly record struct StopPhase(double OpeningDecelMps2, double DecelRiseMps3, double LengthS);
