namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>A car's motion along its path in closed form, piece by piece: at rest until the
/// start, then segments of constant jerk (constant acceleration is jerk 0), a smooth sin² rise of
/// acceleration, or constant power. Formulas: kinematics, any textbook (d = v₀τ + a₀τ²/2 + jτ³/6;
/// under constant power P/m the kinetic energy rises linearly, so v = √(v₀² + 2(P/m)τ) and
/// d = (v³ − v₀³)/(3·P/m)).</summary>
internal sealed class Motion
{
    private readonly List<Segment> segments = [];

    private Motion(double startS)
    {
        StartS = startS;
        EndS = startS;
    }

    /// <summary>First motion, seconds.</summary>
    public double StartS { get; }

    /// <summary>End of the last segment, seconds.</summary>
    public double EndS { get; private set; }

    /// <summary>True when the last segment ends at rest.</summary>
    public bool EndsAtRest => segments.Count > 0 && Math.Abs(segments[^1].EndV) < 1e-9;

    public static Motion FromRestAt(double startS) => new(startS);

    /// <summary>Acceleration rising (or falling) at a constant jerk from its current value.</summary>
    public Motion Jerk(double jerkMps3, double durationS)
    {
        Last(out double v, out double a, out double d);
        return Add(new Segment(Kind.Polynomial, EndS, durationS, d, v, a, jerkMps3, 0));
    }

    /// <summary>Constant acceleration.</summary>
    public Motion Accelerate(double accelMps2, double durationS)
    {
        Last(out double v, out _, out double d);
        return Add(new Segment(Kind.Polynomial, EndS, durationS, d, v, accelMps2, 0, 0));
    }

    /// <summary>Constant speed.</summary>
    public Motion Cruise(double durationS) => Accelerate(0, durationS);

    /// <summary>Acceleration rising smoothly from 0 to <paramref name="accelMps2"/> as sin²(πτ/2T).</summary>
    public Motion SmoothRise(double accelMps2, double riseS)
    {
        Last(out double v, out _, out double d);
        return Add(new Segment(Kind.SinSquared, EndS, riseS, d, v, accelMps2, 0, 0));
    }

    /// <summary>Constant power per unit mass, W/kg (speed must already be above 0).</summary>
    public Motion ConstantPower(double powerPerMassWPerKg, double durationS)
    {
        Last(out double v, out _, out double d);
        return Add(new Segment(Kind.Power, EndS, durationS, d, v, 0, 0, powerPerMassWPerKg));
    }

    /// <summary>Constant deceleration to rest.</summary>
    public Motion BrakeToStop(double decelMps2)
    {
        Last(out double v, out _, out _);
        return Accelerate(-decelMps2, v / decelMps2);
    }

    /// <summary>Distance, speed and acceleration at <paramref name="t"/>.</summary>
    public (double D, double V, double A) At(double t)
    {
        if (t <= StartS || segments.Count == 0)
        {
            return (0, 0, 0);
        }

        foreach (Segment s in segments)
        {
            if (t <= s.Start + s.Duration)
            {
                return s.At(t - s.Start);
            }
        }

        Segment last = segments[^1];
        (double d, double v, _) = last.At(last.Duration);
        return (d + (v * (t - EndS)), v, 0);
    }

    /// <summary>The first time the distance reaches <paramref name="distanceM"/>; null when it never does.</summary>
    public double? TimeAtDistance(double distanceM)
    {
        foreach (Segment s in segments)
        {
            if (s.At(s.Duration).D >= distanceM)
            {
                return Bisect(s.Start, s.Start + s.Duration, t => At(t).D - distanceM);
            }
        }

        Segment last = segments[^1];
        (double d, double v, _) = last.At(last.Duration);
        return v > 0 ? EndS + ((distanceM - d) / v) : null;
    }

    /// <summary>The first time the speed reaches <paramref name="speedMps"/>; null when it never does.</summary>
    public double? TimeAtSpeed(double speedMps)
    {
        foreach (Segment s in segments)
        {
            double begin = s.Start;
            double end = s.Start + s.Duration;

            // Speeds within a segment are monotonic for the shapes here.
            if (s.At(0).V < speedMps && s.At(s.Duration).V >= speedMps)
            {
                return Bisect(begin, end, t => At(t).V - speedMps);
            }
        }

        return null;
    }

    private static double Bisect(double lo, double hi, Func<double, double> f)
    {
        for (int i = 0; i < 200 && hi - lo > 1e-12; i++)
        {
            double mid = 0.5 * (lo + hi);
            if (f(mid) >= 0)
            {
                hi = mid;
            }
            else
            {
                lo = mid;
            }
        }

        return hi;
    }

    private void Last(out double v, out double a, out double d)
    {
        if (segments.Count == 0)
        {
            v = a = d = 0;
            return;
        }

        Segment s = segments[^1];
        (d, v, a) = s.At(s.Duration);
    }

    private Motion Add(Segment segment)
    {
        segments.Add(segment);
        EndS += segment.Duration;
        return this;
    }

    private enum Kind
    {
        Polynomial,
        SinSquared,
        Power,
    }

    private sealed record Segment(Kind Kind, double Start, double Duration, double D0, double V0, double A0, double J, double P)
    {
        public double EndV => At(Duration).V;

        public (double D, double V, double A) At(double tau)
        {
            switch (Kind)
            {
                case Kind.SinSquared:
                {
                    double T = Duration;
                    double s = Math.Sin(Math.PI * tau / (2 * T));
                    double a = A0 * s * s;
                    double v = V0 + (A0 * ((tau / 2) - (T / (2 * Math.PI) * Math.Sin(Math.PI * tau / T))));
                    double d = D0 + (V0 * tau) + (A0 * ((tau * tau / 4) + (T * T / (2 * Math.PI * Math.PI) * (Math.Cos(Math.PI * tau / T) - 1))));
                    return (d, v, a);
                }

                case Kind.Power:
                {
                    double v = Math.Sqrt((V0 * V0) + (2 * P * tau));
                    double d = D0 + (((v * v * v) - (V0 * V0 * V0)) / (3 * P));
                    return (d, v, P / v);
                }

                default:
                {
                    double a = A0 + (J * tau);
                    double v = V0 + (A0 * tau) + (J * tau * tau / 2);
                    double d = D0 + (V0 * tau) + (A0 * tau * tau / 2) + (J * tau * tau * tau / 6);
                    return (d, v, a);
                }
            }
        }
    }
}
