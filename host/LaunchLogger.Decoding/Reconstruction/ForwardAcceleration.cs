using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Statistics;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The accelerometer's forward axis as read: sample times, forward (and, when measured,
/// vertical) specific force and the sample period. Never changed once made; its resting level is
/// read from it (<see cref="ReadRest"/>) and handed on as an <see cref="AccelRest"/>, and a
/// clock's correction makes a new one (<see cref="Shifted"/>).</summary>
internal sealed class ForwardAcceleration
{
    private ForwardAcceleration(double[] timeS, double[] forwardMps2, double[]? verticalMps2, double periodS)
    {
        TimeS = timeS;
        ForwardMps2 = forwardMps2;
        VerticalMps2 = verticalMps2;
        PeriodS = periodS;
    }

    /// <summary>Vertical specific force as read, m/s², when all axes were measured.</summary>
    public double[]? VerticalMps2 { get; }

    /// <summary>Sample times, s.</summary>
    public double[] TimeS { get; }

    /// <summary>These samples on a time axis moved by <paramref name="shiftS"/> (a copy: the run's
    /// own samples stay as read).</summary>
    public ForwardAcceleration Shifted(double shiftS)
    {
        var moved = new double[TimeS.Length];
        for (int i = 0; i < moved.Length; i++)
        {
            moved[i] = TimeS[i] + shiftS;
        }

        return new ForwardAcceleration(moved, ForwardMps2, VerticalMps2, PeriodS);
    }

    /// <summary>Forward specific force as read, m/s².</summary>
    public double[] ForwardMps2 { get; }

    /// <summary>Sample period, seconds.</summary>
    public double PeriodS { get; }

    public int Count => TimeS.Length;

    /// <summary>The run's forward axis, or null when it has too few samples to use.</summary>
    public static ForwardAcceleration? From(AccelSeries? series)
    {
        if (series is null || series.Count < 8 || series.ForwardMps2.Length != series.Count)
        {
            return null;
        }

        double period = series.SamplePeriodS;
        if (!(period > 0))
        {
            period = (series.TimeS[^1] - series.TimeS[0]) / (series.Count - 1);
        }

        double[]? vertical = series.HasAllAxes && series.VerticalMps2.Length == series.Count ? series.VerticalMps2 : null;
        return period > 0 ? new ForwardAcceleration(series.TimeS, series.ForwardMps2, vertical, period) : null;
    }

    /// <summary>Index of the first sample at or after <paramref name="t"/>.</summary>
    public int IndexAtOrAfter(double t)
    {
        int i = Array.BinarySearch(TimeS, t);
        return i >= 0 ? i : ~i;
    }

    /// <summary>The resting level and noise of samples [<paramref name="from"/>,
    /// <paramref name="to"/>), clipping outliers beyond five σ; null when there are fewer than 8.</summary>
    public AccelRest? ReadRest(int from, int to)
    {
        from = Math.Max(0, from);
        to = Math.Min(Count, to);
        if (to - from < 8)
        {
            return null;
        }

        Robust rest = Robust.Mean(ForwardMps2, from, to, varianceFloor: 1e-12);
        double restVertical = 0;
        if (VerticalMps2 != null)
        {
            double vertical = 0;
            for (int i = from; i < to; i++)
            {
                vertical += VerticalMps2[i];
            }

            restVertical = vertical / (to - from);
        }

        return new AccelRest
        {
            LevelMps2 = rest.Value,
            LevelSigmaMps2 = rest.Sigma,
            NoiseMps2 = rest.NoiseSigma,
            CorrelationFactor = rest.CorrelationFactor,
            VerticalMps2 = restVertical,
        };
    }

    /// <summary>Forward acceleration with the resting level removed and, when the vertical axis
    /// was measured, the body's pitch under load taken out.</summary>
    /// <remarks>
    /// <para>In the frame of the resting reading (turned by the resting pitch θ so that gravity is
    /// straight down), a body pitched a further δ by squat or dive reads, forward and up,
    /// p = a·cos δ + g·sin δ and q = −a·sin δ − g·(1 − cos δ) (specific force rotated by δ;
    /// rigid-body kinematics, any textbook). Gravity leaks into p as g·δ — several per cent of a
    /// under hard acceleration, and proportional to it — while q shows δ directly: δ ≈ −q/p.
    /// A forward-axis offset makes the resting reading lean by ε, which adds −ε to −q/p; as squat
    /// and dive vanish with the acceleration, ε is the intercept of −q/p against p over the run.
    /// Over 0.1-s means of p and q (body pitch moves at 1–2 Hz), δ = (−q·p − ε·p²)/(p² + p₀²) with p₀ = 0.5 m/s² keeps the
    /// estimate quiet when there is too little acceleration to see it; a = p − g·sin δ.</para>
    /// <para>Not separated: the body's vertical acceleration (heave), which reads as pitch for a
    /// moment while the body settles.</para>
    /// </remarks>
    public double[] Input(AccelRest rest, double pitchRad, bool compensatePitch)
    {
        int n = Count;
        var u = new double[n];
        double cos = Math.Cos(pitchRad);
        double sin = Math.Sin(pitchRad);
        double[]? vertical = compensatePitch ? VerticalMps2 : null;
        if (vertical is null)
        {
            for (int i = 0; i < n; i++)
            {
                u[i] = (ForwardMps2[i] - rest.LevelMps2) / cos;
            }

            return u;
        }

        const double p0 = 0.5;
        int half = Math.Max(1, (int)Math.Round(0.05 / PeriodS));
        var plane = new PitchPlane(ForwardMps2, vertical, rest.LevelMps2, rest.VerticalMps2, cos, sin);

        // An offset on the forward axis tilts the resting reading away from gravity by ε, and
        // then q also holds a·ε: −q/p = δ − ε. Squat and dive vanish with the acceleration, so
        // ε is the intercept of −q/p against p (least squares weighted by p², where |p| > 1 m/s²).
        double s0 = 0, s1 = 0, s2 = 0, r0 = 0, r1 = 0;
        var means = new RunningMeans(n, half);
        for (int i = 0; i < n; i++)
        {
            means.MoveTo(i, plane, out double mp, out double mq);
            if (Math.Abs(mp) > 1)
            {
                double w = mp * mp;
                double y = -mq / mp;
                s0 += w;
                s1 += w * mp;
                s2 += w * mp * mp;
                r0 += w * y;
                r1 += w * mp * y;
            }
        }

        double det = (s0 * s2) - (s1 * s1);
        double tilt = det > 0 && s0 > 0 ? ((r0 * s2) - (s1 * r1)) / det : 0;
        means = new RunningMeans(n, half);
        for (int i = 0; i < n; i++)
        {
            means.MoveTo(i, plane, out double mp, out double mq);
            double delta = ((-mq * mp) - (tilt * mp * mp)) / ((mp * mp) + (p0 * p0));
            u[i] = plane.P(i) - (Units.StandardGravity * Math.Sin(delta));
        }

        return u;
    }

    /// <summary>Readings turned into the resting frame: p forward, q up, rest removed.</summary>
    private readonly struct PitchPlane(double[] forward, double[] vertical, double restForward, double restVertical, double cos, double sin)
    {
        public double P(int i) => ((forward[i] - restForward) * cos) - ((vertical[i] - restVertical) * sin);

        public double Q(int i) => ((forward[i] - restForward) * sin) + ((vertical[i] - restVertical) * cos);
    }

    /// <summary>Centred running means of p and q, window ±half, advanced one index at a time.</summary>
    private struct RunningMeans(int count, int half)
    {
        private double sumP;
        private double sumQ;
        private int lo;
        private int hi = -1;

        public void MoveTo(int i, in PitchPlane plane, out double meanP, out double meanQ)
        {
            int wantLo = Math.Max(0, i - half);
            int wantHi = Math.Min(count - 1, i + half);
            while (hi < wantHi)
            {
                hi++;
                sumP += plane.P(hi);
                sumQ += plane.Q(hi);
            }

            while (lo < wantLo)
            {
                sumP -= plane.P(lo);
                sumQ -= plane.Q(lo);
                lo++;
            }

            meanP = sumP / (hi - lo + 1);
            meanQ = sumQ / (hi - lo + 1);
        }
    }

    /// <summary>Noise density of the input from <paramref name="startS"/> on, m²/s³: the measured
    /// part (<see cref="MeasuredInputDensity"/>) and what the model misses
    /// (<see cref="ReconstructionOptions.AccelModelNoiseDensity"/>).</summary>
    public double InputDensity(AccelRest rest, double startS, ReconstructionOptions options) =>
        MeasuredInputDensity(rest, startS, options.AccelNoiseMps2) + options.AccelModelNoiseDensity;

    /// <summary>The part of the input's noise density measured from the samples from
    /// <paramref name="startS"/> on, m²/s³: the moving noise per sample (or
    /// <paramref name="toldNoiseMps2"/>) squared times the sample period, widened by the resting
    /// noise's correlation from sample to sample.</summary>
    public double MeasuredInputDensity(AccelRest rest, double startS, double? toldNoiseMps2)
    {
        double noise = toldNoiseMps2 ?? MovingNoise(rest, IndexAtOrAfter(startS), Count);
        return noise * noise * PeriodS * rest.CorrelationFactor * rest.CorrelationFactor;
    }

    /// <summary>Per-sample noise while moving, from first differences (robust: median absolute
    /// deviation), m/s²; never below the resting noise of <paramref name="rest"/>.</summary>
    public double MovingNoise(AccelRest rest, int from, int to)
    {
        from = Math.Max(1, from);
        to = Math.Min(Count, to);
        if (to - from < 16)
        {
            return rest.NoiseMps2;
        }

        // At most 4096 differences, evenly spread: plenty for a median.
        int stride = Math.Max(1, (to - from) / 4096);
        var diffs = new double[((to - from - 1) / stride) + 1];
        for (int k = 0; k < diffs.Length; k++)
        {
            int i = from + (k * stride);
            diffs[k] = Math.Abs(ForwardMps2[i] - ForwardMps2[i - 1]);
        }

        Array.Sort(diffs);
        double mad = diffs[diffs.Length / 2];

        // For Gaussian noise the median |difference| is 0.6745·√2·σ.
        return Math.Max(rest.NoiseMps2, mad / (0.6745 * Math.Sqrt(2)));
    }
}
