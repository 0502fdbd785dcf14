using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>Turns a <see cref="Motion"/> into what the box would have logged: pulse observations
/// (exact edges or a polled counter), accelerometer samples with noise, offset, resting tilt and
/// pitch under squat, and the events. Everything random comes from one seed.</summary>
internal sealed record SyntheticRun
{
    public const double G0 = 9.80665;

    public required Motion Motion { get; init; }

    public int Seed { get; init; } = 1;

    /// <summary>Pulses per wheel revolution.</summary>
    public int Teeth { get; init; } = 48;

    /// <summary>Rolling circumference, metres.</summary>
    public double CircumferenceM { get; init; } = 1.96;

    /// <summary>Pickup phase φ ∈ [0, m): count N is reached at distance N·m − φ. Null: drawn uniformly.</summary>
    public double? PhaseM { get; init; }

    /// <summary>1-σ tooth position error as a fraction of the pitch (fixed per tooth).</summary>
    public double ToothErrorFraction { get; init; } = 0.005;

    /// <summary>Poll period of a polled counter, seconds; null for exact edges (1 µs brackets).</summary>
    public double? PollPeriodS { get; init; }

    /// <summary>1-σ jitter of each poll period, seconds.</summary>
    public double PollJitterS { get; init; }

    /// <summary>Stalls of the polling loop per second (a frame written, a collection), each
    /// <see cref="PollStallS"/> long.</summary>
    public double PollStallsPerSecond { get; init; }

    /// <summary>Length of one stall of the polling loop, seconds.</summary>
    public double PollStallS { get; init; }

    public bool WithPulses { get; init; } = true;

    public bool WithAccelerometer { get; init; } = true;

    public double AccelRateHz { get; init; } = 1000;

    /// <summary>White noise per sample, m/s².</summary>
    public double AccelNoiseMps2 { get; init; } = 0.04;

    /// <summary>Sensor offset on the forward axis, m/s².</summary>
    public double AccelBiasMps2 { get; init; } = 0.1;

    /// <summary>Resting pitch, radians (nose up positive).</summary>
    public double PitchRad { get; init; } = 0.02;

    /// <summary>Extra pitch per m/s² of acceleration (squat), radians.</summary>
    public double SquatRadPerMps2 { get; init; } = 0.001;

    /// <summary>Accelerometer readings rounded to whole milli-g like the sensor's output.</summary>
    public bool QuantiseMilliG { get; init; } = true;

    /// <summary>Pre-trigger samples kept before first motion, seconds.</summary>
    public double PreTriggerS { get; init; } = 1.5;

    /// <summary>Driven-wheel spin: extra wheel speed rising and falling as sin² over the window,
    /// m/s at its peak (negative for a wheel sliding under braking).</summary>
    public double SpinPeakMps { get; init; }

    public double SpinStartS { get; init; }

    public double SpinLengthS { get; init; }

    /// <summary>Drive slip of the pickup wheel: slip ratio per m/s² of drive force per unit mass,
    /// the drive being a + 3.4·10⁻⁴·v² + 0.012·g0 when positive (a linear tyre slip law, the
    /// same form the reconstruction assumes), s²/m.</summary>
    public double DriveSlipPerMps2 { get; init; }

    /// <summary>Teeth of a second pickup on an undriven wheel of the same circumference; 0 for none.</summary>
    public int SecondTeeth { get; init; }

    /// <summary>1-σ of each of the second ring's edges off its even place, as a fraction of a pitch
    /// (0: an evenly cut ring).</summary>
    public double SecondToothErrorFraction { get; init; }

    /// <summary>The box's first-motion mark to put in the log, seconds; null for none.</summary>
    public double? FirmwareMotionS { get; init; }

    public double? FirmwareRolloutS { get; init; }

    public bool Staged { get; init; } = true;

    public double MetresPerPulse => CircumferenceM / Teeth;

    private double[]? slipTable;

    /// <summary>Wheel distance: the car's plus what spin and drive slip added.</summary>
    public double WheelDistance(double t)
    {
        double d = Motion.At(t).D + DriveSlipDistance(t);
        if (SpinPeakMps != 0 && t > SpinStartS)
        {
            double tau = Math.Min(t - SpinStartS, SpinLengthS);
            double T = SpinLengthS;
            d += SpinPeakMps * ((tau / 2) - (T / (4 * Math.PI) * Math.Sin(2 * Math.PI * tau / T)));
        }

        return d;
    }

    /// <summary>k·∫ v·drive dt, tabulated at 1 ms and interpolated.</summary>
    private double DriveSlipDistance(double t)
    {
        if (DriveSlipPerMps2 == 0 || t <= Motion.StartS)
        {
            return 0;
        }

        const double step = 0.001;
        if (slipTable is null)
        {
            int count = (int)((Motion.EndS - Motion.StartS) / step) + 2;
            var table = new double[count];
            for (int i = 1; i < count; i++)
            {
                double mid = Motion.StartS + ((i - 0.5) * step);
                (_, double v, double a) = Motion.At(mid);
                double drive = Math.Max(a + (3.4e-4 * v * v) + (0.012 * G0), 0);
                table[i] = table[i - 1] + (DriveSlipPerMps2 * v * drive * step);
            }

            slipTable = table;
        }

        double x = Math.Min((t - Motion.StartS) / step, slipTable.Length - 1.000001);
        int k = (int)x;
        return slipTable[k] + ((x - k) * (slipTable[k + 1] - slipTable[k]));
    }

    /// <summary>Exact-edge observations of a ring with <paramref name="teeth"/> pulses per
    /// <see cref="CircumferenceM"/> following <paramref name="distance"/>.</summary>
    private List<PulseRecord> ExactEdges(Func<double, double> distance, int teeth, Random random)
    {
        double mpp = CircumferenceM / teeth;
        double phase = random.NextDouble() * mpp;
        var toothError = new double[teeth];
        if (SecondToothErrorFraction > 0)
        {
            for (int i = 0; i < teeth; i++)
            {
                toothError[i] = Gaussian(random) * SecondToothErrorFraction * mpp;
            }
        }

        var records = new List<PulseRecord>();
        double end = distance(Motion.EndS);
        for (long n = 1; (n * mpp) - phase + toothError[n % teeth] < end; n++)
        {
            double at = (n * mpp) - phase + toothError[n % teeth];
            double t = Bisect(Motion.StartS, Motion.EndS, s => distance(s) - at);
            double hi = Math.Ceiling(t * 1e6) / 1e6;
            records.Add(new PulseRecord(n, hi - 1e-6, hi));
        }

        return records;
    }

    /// <summary>Reconstructs <paramref name="run"/>, made here, whose wheel has no inertia: it
    /// does not lag the road as it is spun up, and does not slip under braking unless made to
    /// slide; the reconstruction is told so (<see cref="ReconstructionOptions.UndrivenSlipPerMps2"/> 0,
    /// <see cref="ReconstructionOptions.BrakeSlip"/> none).</summary>
    public static ReconstructedRun Reconstruct(DecodedRun run, ReconstructionOptions? options = null) =>
        Reconstructor.Reconstruct(run, (options ?? ReconstructionOptions.Default) with { UndrivenSlipPerMps2 = 0, UndrivenSlipSigma = 0, BrakeSlip = LaunchLogger.Decoding.Braking.BrakeSlipPrior.None });

    /// <summary>The ring's edge errors, metres, as <see cref="Build"/> draws them: edge n sits at
    /// n·m − phase + e[n mod <see cref="Teeth"/>].</summary>
    public double[] ToothErrorsM() => DrawRing(new Random(Seed), out _);

    private double[] DrawRing(Random random, out double phase)
    {
        double mpp = MetresPerPulse;
        phase = PhaseM ?? (random.NextDouble() * mpp);
        var toothError = new double[Teeth];
        for (int i = 0; i < Teeth; i++)
        {
            toothError[i] = Gaussian(random) * ToothErrorFraction * mpp;
        }

        return toothError;
    }

    public DecodedRun Build()
    {
        slipTable = null;
        var random = new Random(Seed);
        double mpp = MetresPerPulse;
        double[] toothError = DrawRing(random, out double phase);

        double end = Motion.EndS;
        var pulses = new List<PulseRecord>();
        if (WithPulses)
        {
            var edges = new List<double>();
            double wheelEnd = WheelDistance(end);
            for (long n = 1; ; n++)
            {
                double at = (n * mpp) - phase + toothError[n % Teeth];
                if (at >= wheelEnd)
                {
                    break;
                }

                edges.Add(Bisect(Motion.StartS, end, t => WheelDistance(t) - at));
            }

            // Tooth errors can swap neighbours in time only if larger than a pitch; keep order anyway.
            edges.Sort();
            if (PollPeriodS is { } poll)
            {
                double previous = Motion.StartS - (random.NextDouble() * poll);
                int next = 0;
                long count = 0;
                while (next < edges.Count)
                {
                    double now = previous + poll + (PollJitterS * Gaussian(random));
                    if (now <= previous)
                    {
                        now = previous + (0.1 * poll);
                    }

                    if (PollStallsPerSecond > 0 && random.NextDouble() < PollStallsPerSecond * poll)
                    {
                        now += PollStallS;
                    }

                    while (next < edges.Count && edges[next] <= now)
                    {
                        next++;
                    }

                    if (next > count)
                    {
                        count = next;
                        pulses.Add(new PulseRecord(count, Micro(previous), Micro(now)));
                    }

                    previous = now;
                }
            }
            else
            {
                for (int i = 0; i < edges.Count; i++)
                {
                    double hi = Math.Ceiling(edges[i] * 1e6) / 1e6;
                    pulses.Add(new PulseRecord(i + 1, hi - 1e-6, hi));
                }
            }
        }

        double runEnd = Motion.EndsAtRest ? end + 2.0 : end;
        AccelSeries? accel = null;
        if (WithAccelerometer)
        {
            double period = 1 / AccelRateHz;
            double first = Motion.StartS - PreTriggerS - (random.NextDouble() * period);
            int count = (int)((runEnd - first) / period) + 1;
            var time = new double[count];
            var forward = new double[count];
            var vertical = new double[count];
            for (int i = 0; i < count; i++)
            {
                double t = first + (i * period);
                double a = Motion.At(t).A;
                double pitch = PitchRad + (SquatRadPerMps2 * a);
                double f = (a * Math.Cos(pitch)) + (G0 * Math.Sin(pitch)) + AccelBiasMps2 + (AccelNoiseMps2 * Gaussian(random));
                double z = (-a * Math.Sin(pitch)) + (G0 * Math.Cos(pitch)) + (AccelNoiseMps2 * Gaussian(random));
                time[i] = t;
                forward[i] = QuantiseMilliG ? Math.Round(f / G0 * 1000) * G0 / 1000 : f;
                vertical[i] = QuantiseMilliG ? Math.Round(z / G0 * 1000) * G0 / 1000 : z;
            }

            accel = new AccelSeries
            {
                TimeS = time,
                ForwardMps2 = forward,
                LateralMps2 = new double[count],
                VerticalMps2 = vertical,
                HasAllAxes = true,
                SamplePeriodS = period,
            };
        }

        List<PulseRecord> second = SecondTeeth > 0 ? ExactEdges(t => Motion.At(t).D, SecondTeeth, random) : [];
        var events = new List<RunEvent>();
        if (Motion.EndsAtRest && pulses.Count > 0)
        {
            events.Add(new RunEvent(EventKind.Stopped, pulses[^1].HiS, []));
        }

        double restX = ((G0 * Math.Sin(PitchRad)) + AccelBiasMps2) / G0 * 1000;
        double restZ = G0 * Math.Cos(PitchRad) / G0 * 1000;
        return new DecodedRun
        {
            Source = $"synthetic seed {Seed}",
            Configuration = new RunConfiguration
            {
                Staged = Staged,
                OpenedS = Motion.StartS,
                PulsesPerRevolution = Teeth,
                CircumferenceM = CircumferenceM,
                MetresPerPulse = mpp,
                RolloutM = 0.3048,
                HasSecondChannel = SecondTeeth > 0,
                SecondMetresPerPulse = SecondTeeth > 0 ? CircumferenceM / SecondTeeth : 0,
                SecondPulsesPerRevolution = SecondTeeth,
                HasAccelerometer = WithAccelerometer,
                AccelNominalRateHz = AccelRateHz,
                AccelFullScaleMps2 = 8 * G0,
                StopHoldS = 2.0,
                BracketLimitS = 0.002,
            },
            Pulses = pulses,
            SecondPulses = second,
            Accel = accel,
            Events = events,
            RestGravityMilliG = WithAccelerometer ? (restX, 0, restZ) : null,
            FirmwareMotionS = FirmwareMotionS,
            FirmwareRolloutS = FirmwareRolloutS,
            Complete = true,
        };
    }

    private static double Micro(double t) => Math.Round(t * 1e6) / 1e6;

    public static double Gaussian(Random random)
    {
        // Box–Muller transform.
        double u1 = 1.0 - random.NextDouble();
        double u2 = random.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }

    private static double Bisect(double lo, double hi, Func<double, double> f)
    {
        for (int i = 0; i < 200 && hi - lo > 1e-10; i++)
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
}
