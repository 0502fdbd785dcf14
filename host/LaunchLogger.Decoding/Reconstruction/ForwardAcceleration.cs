using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The accelerometer's forward axis with its resting level: what it reads standing
/// still (gravity leaking in through the resting pitch, plus the sensor's offset) and how noisy
/// it is there.</summary>
internal sealed class ForwardAcceleration
{
    private ForwardAcceleration(double[] timeS, double[] forwardMps2, double periodS)
    {
        TimeS = timeS;
        ForwardMps2 = forwardMps2;
        PeriodS = periodS;
    }

    public double[] TimeS { get; }

    /// <summary>Forward specific force as read, m/s².</summary>
    public double[] ForwardMps2 { get; }

    /// <summary>Sample period, seconds.</summary>
    public double PeriodS { get; }

    /// <summary>Mean forward reading at rest, m/s².</summary>
    public double RestLevelMps2 { get; private set; }

    /// <summary>σ of <see cref="RestLevelMps2"/>, m/s².</summary>
    public double RestLevelSigmaMps2 { get; private set; }

    /// <summary>Per-sample noise at rest, m/s².</summary>
    public double NoiseMps2 { get; private set; }

    /// <summary>How much the resting noise's correlation from sample to sample widens
    /// uncertainties of averages (1 for white noise).</summary>
    public double CorrelationFactor { get; private set; } = 1;

    /// <summary>Samples the resting level was taken from.</summary>
    public int RestCount { get; private set; }

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

        return period > 0 ? new ForwardAcceleration(series.TimeS, series.ForwardMps2, period) : null;
    }

    /// <summary>Index of the first sample at or after <paramref name="t"/>.</summary>
    public int IndexAtOrAfter(double t)
    {
        int i = Array.BinarySearch(TimeS, t);
        return i >= 0 ? i : ~i;
    }

    /// <summary>Takes the resting level and noise from samples [<paramref name="from"/>,
    /// <paramref name="to"/>), clipping outliers beyond five σ.</summary>
    /// <returns>False when there are fewer than 8 samples.</returns>
    public bool SetRest(int from, int to)
    {
        from = Math.Max(0, from);
        to = Math.Min(Count, to);
        if (to - from < 8)
        {
            return false;
        }

        double mean = Median(ForwardMps2, from, to);
        double sigma = double.PositiveInfinity;
        int used = 0;
        for (int pass = 0; pass < 3; pass++)
        {
            double sum = 0;
            double sumSq = 0;
            used = 0;
            for (int i = from; i < to; i++)
            {
                double e = ForwardMps2[i] - mean;
                if (Math.Abs(e) <= 5 * sigma)
                {
                    sum += e;
                    sumSq += e * e;
                    used++;
                }
            }

            double shift = sum / used;
            mean += shift;
            sigma = Math.Sqrt(Math.Max((sumSq / used) - (shift * shift), 1e-12));
        }

        // Lag-one correlation of the resting noise: averages of correlated noise are worth fewer samples.
        double c0 = 0;
        double c1 = 0;
        for (int i = from; i < to; i++)
        {
            double e = ForwardMps2[i] - mean;
            c0 += e * e;
            if (i + 1 < to)
            {
                c1 += e * (ForwardMps2[i + 1] - mean);
            }
        }

        double rho = c0 > 0 ? Math.Clamp(c1 / c0, 0, 0.8) : 0;
        CorrelationFactor = Math.Sqrt((1 + rho) / (1 - rho));
        RestLevelMps2 = mean;
        NoiseMps2 = sigma;
        RestCount = used;
        RestLevelSigmaMps2 = sigma * CorrelationFactor / Math.Sqrt(used);
        return true;
    }

    /// <summary>Uses a known resting level (e.g. the staging event's vector) when the samples
    /// before first motion are too few.</summary>
    public void SetRest(double levelMps2, double noiseMps2)
    {
        RestLevelMps2 = levelMps2;
        NoiseMps2 = noiseMps2;
        RestLevelSigmaMps2 = noiseMps2;
        RestCount = 0;
        CorrelationFactor = 1;
    }

    /// <summary>Per-sample noise while moving, from first differences (robust: median absolute
    /// deviation), m/s²; never below the resting noise.</summary>
    public double MovingNoise(int from, int to)
    {
        from = Math.Max(1, from);
        to = Math.Min(Count, to);
        if (to - from < 16)
        {
            return NoiseMps2;
        }

        var diffs = new double[to - from];
        for (int i = from; i < to; i++)
        {
            diffs[i - from] = Math.Abs(ForwardMps2[i] - ForwardMps2[i - 1]);
        }

        Array.Sort(diffs);
        double mad = diffs[diffs.Length / 2];

        // For Gaussian noise the median |difference| is 0.6745·√2·σ.
        return Math.Max(NoiseMps2, mad / (0.6745 * Math.Sqrt(2)));
    }

    private static double Median(double[] values, int from, int to)
    {
        var copy = values[from..to];
        Array.Sort(copy);
        return copy[copy.Length / 2];
    }
}
