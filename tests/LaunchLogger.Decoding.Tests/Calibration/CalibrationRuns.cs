using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Calibration;

/// <summary>Decoded runs built in closed form for the calibration tests: a rest, then a constant
/// acceleration along the car (or a steady cruise), read by an accelerometer with a known
/// resting vector and yaw, and a toothed pickup with known tooth positions.</summary>
internal static class CalibrationRuns
{
    public const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)

    /// <summary>A staged run: still for <paramref name="restS"/>, then a constant acceleration
    /// <paramref name="accelMps2"/> for <paramref name="accelerateS"/> along the car.</summary>
    /// <param name="rest">The resting specific force (forward, lateral, vertical), m/s².</param>
    /// <param name="yawRad">The box's forward axis turned this far to the left of the car's.</param>
    public static DecodedRun Launch(
        (double F, double L, double U) rest,
        double yawRad = 0,
        double accelMps2 = 3.0,
        double restS = 2.0,
        double accelerateS = 5.0,
        double noiseMps2 = 0.04,
        int seed = 1,
        double rateHz = 1000,
        bool staged = true,
        bool complete = true,
        string source = "synthetic.log run 1")
    {
        var random = new Random(seed);
        double mpp = 1.96 / 48;
        double period = 1 / rateHz;
        double end = restS + accelerateS;
        int n = (int)Math.Round(end / period);
        var time = new double[n];
        var forward = new double[n];
        var lateral = new double[n];
        var vertical = new double[n];
        for (int i = 0; i < n; i++)
        {
            double t = (i + 0.5) * period;
            double a = t >= restS ? accelMps2 : 0;
            time[i] = t;
            forward[i] = rest.F + (a * Math.Cos(yawRad)) + Gauss(random, noiseMps2);
            lateral[i] = rest.L - (a * Math.Sin(yawRad)) + Gauss(random, noiseMps2);
            vertical[i] = rest.U + Gauss(random, noiseMps2);
        }

        // Kinematics (any textbook): from rest at a, the count c is reached at t0 + √(2·c·m/a).
        var pulses = new List<PulseRecord>();
        for (long c = 1; ; c++)
        {
            double t = restS + Math.Sqrt(2 * c * mpp / accelMps2);
            if (t > end)
            {
                break;
            }

            pulses.Add(new PulseRecord(c, t - 1e-6, t));
        }

        return new DecodedRun
        {
            Source = source,
            Configuration = Configuration(48, 1.96, staged),
            Pulses = pulses,
            Accel = new AccelSeries
            {
                TimeS = time,
                ForwardMps2 = forward,
                LateralMps2 = lateral,
                VerticalMps2 = vertical,
                HasAllAxes = true,
                SamplePeriodS = period,
            },
            FirmwareMotionS = restS + 0.02,
            Complete = complete,
        };
    }

    /// <summary>A cruise: the count c is reached when the wheel has turned to the position of
    /// edge c, at speed v(t) = <paramref name="speedMps"/> + <paramref name="accelMps2"/>·t.</summary>
    /// <param name="edgePositionsRev">Position of each edge around the ring in revolutions; the
    /// edge with hardware count h is edge (h mod n).</param>
    /// <param name="originCount">Hardware count at the run's origin.</param>
    /// <param name="bracketS">Mean poll period of a polled counter (brackets that wide), or 1 µs for exact edges.</param>
    /// <param name="doubledAtCount">A spurious extra count from here on (noise on the wire), or 0.</param>
    public static DecodedRun Cruise(
        double[] edgePositionsRev,
        double circumferenceM,
        double speedMps,
        double durationS,
        long originCount = 0,
        double accelMps2 = 0,
        double bracketS = 1e-6,
        double jitterS = 0,
        long doubledAtCount = 0,
        int seed = 1)
    {
        var random = new Random(seed);
        int n = edgePositionsRev.Length;
        double Angle(long h) => Math.Floor((double)h / n) + edgePositionsRev[h % n];
        var pulses = new List<PulseRecord>();
        double poll = 0;
        double previousPoll = 0;
        for (long c = 1; ; c++)
        {
            // A doubled edge: from then on the counter runs one ahead of the ring.
            long physical = originCount + c - (doubledAtCount > 0 && c >= doubledAtCount ? 1 : 0);
            double distance = (Angle(physical) - Angle(originCount)) * circumferenceM;
            double t = TimeAt(distance, speedMps, accelMps2) + (doubledAtCount > 0 && c == doubledAtCount ? 1e-4 : 0);
            if (double.IsNaN(t) || t > durationS)
            {
                break;
            }

            t += Gauss(random, jitterS);
            if (bracketS <= 1e-6)
            {
                pulses.Add(new PulseRecord(c, t - 1e-6, t));
                continue;
            }

            // A polling loop with 20 % jitter in its period: the count is seen at the first poll after the edge.
            while (poll < t)
            {
                previousPoll = poll;
                poll += bracketS * Math.Max(0.2, 1 + Gauss(random, 0.2));
            }

            pulses.Add(new PulseRecord(c, previousPoll, poll));
        }

        return new DecodedRun
        {
            Source = "cruise.log run 1",
            Configuration = Configuration(n, circumferenceM, staged: true),
            Pulses = pulses,
            Complete = true,
        };
    }

    public static RunConfiguration Configuration(int ppr, double circumferenceM, bool staged) => new()
    {
        FormatVersion = 1,
        RunNumber = 1,
        Staged = staged,
        PulsesPerRevolution = ppr,
        CircumferenceM = circumferenceM,
        MetresPerPulse = circumferenceM / ppr,
        HasAccelerometer = true,
        AccelNominalRateHz = 1000,
    };

    /// <summary>Time at which distance <paramref name="d"/> is reached from 0 at t = 0.</summary>
    private static double TimeAt(double d, double v0, double a)
    {
        if (Math.Abs(a) < 1e-12)
        {
            return d / v0;
        }

        double disc = (v0 * v0) + (2 * a * d);
        return disc < 0 ? double.NaN : 2 * d / (v0 + Math.Sqrt(disc));
    }

    private static double Gauss(Random random, double sigma)
    {
        if (sigma <= 0)
        {
            return 0;
        }

        // Box–Muller.
        double u1 = 1.0 - random.NextDouble();
        double u2 = random.NextDouble();
        return sigma * Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}
