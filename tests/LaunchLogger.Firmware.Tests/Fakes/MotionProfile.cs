namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A car's true motion along the track from time 0: piecewise constant acceleration,
/// never rolling backwards (a braking phase ends at rest). Seconds, metres, m/s, m/s².</summary>
public sealed class MotionProfile
{
    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901; ISO 80000-3).</summary>
    public const double G0 = 9.80665;

    private readonly List<Segment> segments = new();

    /// <summary>Starts at distance 0 with <paramref name="initialSpeedMps"/> and no acceleration;
    /// at each change's time (in order) the acceleration becomes the given value.</summary>
    public MotionProfile(double initialSpeedMps, params (double AtS, double AccelMps2)[] changes)
    {
        double t = 0, v = initialSpeedMps, d = 0, a = 0;
        foreach (var (atS, accel) in changes.Append((double.PositiveInfinity, 0.0)))
        {
            if (a < 0 && v <= 0)
            {
                a = 0;
            }

            if (a < 0 && t + (v / -a) < atS)
            {
                // Braking ends at rest before the next change.
                double stopAt = t + (v / -a);
                segments.Add(new Segment(t, stopAt, v, d, a));
                d += v * v / (2 * -a);
                v = 0;
                t = stopAt;
                a = 0;
            }

            segments.Add(new Segment(t, atS, v, d, a));
            if (double.IsFinite(atS))
            {
                double tau = atS - t;
                d += (v * tau) + (a * tau * tau / 2);
                v += a * tau;
                t = atS;
            }

            a = accel;
        }
    }

    /// <summary>Still until <paramref name="launchS"/>, then a constant acceleration for ever.</summary>
    public static MotionProfile Launch(double launchS, double accelMps2) => new(0, (launchS, accelMps2));

    /// <summary>Still, a constant acceleration from <paramref name="launchS"/>, then braking from
    /// <paramref name="brakeS"/> at <paramref name="decelMps2"/> until at rest.</summary>
    public static MotionProfile LaunchAndStop(double launchS, double accelMps2, double brakeS, double decelMps2) =>
        new(0, (launchS, accelMps2), (brakeS, -decelMps2));

    /// <summary>Rolling at a constant speed from time 0.</summary>
    public static MotionProfile Cruise(double speedMps) => new(speedMps);

    public double AccelAt(double s) => Find(s).Accel;

    public double SpeedAt(double s)
    {
        Segment g = Find(s);
        return g.Speed + (g.Accel * (s - g.Start));
    }

    public double DistanceAt(double s)
    {
        Segment g = Find(s);
        double tau = s - g.Start;
        return g.Distance + (g.Speed * tau) + (g.Accel * tau * tau / 2);
    }

    /// <summary>The moment the car first reaches <paramref name="distanceM"/>; +∞ if never.</summary>
    public double TimeAtDistance(double distanceM)
    {
        foreach (Segment g in segments)
        {
            if (g.Speed <= 0 && g.Accel <= 0)
            {
                continue;
            }

            double endDistance = double.IsFinite(g.End) ? DistanceAt(g.End) : double.PositiveInfinity;
            if (distanceM <= endDistance)
            {
                double delta = distanceM - g.Distance;
                if (delta <= 0)
                {
                    return g.Start;
                }

                // Root of v·τ + a·τ²/2 = Δ, in the form that stays exact as a → 0.
                double root = Math.Sqrt(Math.Max(0, (g.Speed * g.Speed) + (2 * g.Accel * delta)));
                return g.Start + (2 * delta / (g.Speed + root));
            }
        }

        return double.PositiveInfinity;
    }

    private Segment Find(double s)
    {
        for (int i = segments.Count - 1; i >= 0; i--)
        {
            if (s >= segments[i].Start)
            {
                return segments[i];
            }
        }

        return segments[0];
    }

    private readonly record struct Segment(double Start, double End, double Speed, double Distance, double Accel);
}
