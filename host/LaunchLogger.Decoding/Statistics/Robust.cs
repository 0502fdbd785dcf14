namespace LaunchLogger.Decoding.Statistics;

/// <summary>A mean with outliers beyond five σ clipped, and its uncertainty widened for
/// correlation from sample to sample.</summary>
/// <param name="Value">The mean.</param>
/// <param name="Sigma">1-σ of the mean.</param>
/// <param name="NoiseSigma">Per-sample scatter.</param>
/// <param name="Count">Samples kept.</param>
/// <param name="CorrelationFactor">√((1 + ρ)/(1 − ρ)) for the lag-one correlation ρ of the samples.</param>
internal readonly record struct Robust(double Value, double Sigma, double NoiseSigma, int Count, double CorrelationFactor = 1)
{
    public Estimate Estimate => new(Value, Sigma);

    /// <summary>Mean of <paramref name="values"/>[from, to): starts at the median, then three
    /// passes that drop samples more than five σ from the mean. The σ of the mean is the scatter
    /// over √n times √((1 + ρ)/(1 − ρ)) for the lag-one correlation ρ (kept in [0, 0.8]), the
    /// usual allowance for an AR(1)-like noise.</summary>
    public static Robust Mean(double[] values, int from, int to, double varianceFloor = 1e-18)
    {
        int length = to - from;
        if (length < 2)
        {
            throw new ArgumentException("at least two samples are needed", nameof(to));
        }

        double[] sorted = values[from..to];
        Array.Sort(sorted);
        double mean = sorted[length / 2];
        double sigma = double.PositiveInfinity;
        int used = 0;
        for (int pass = 0; pass < 3; pass++)
        {
            double sum = 0;
            double sumSquares = 0;
            used = 0;
            for (int i = from; i < to; i++)
            {
                double e = values[i] - mean;
                if (Math.Abs(e) <= 5 * sigma)
                {
                    sum += e;
                    sumSquares += e * e;
                    used++;
                }
            }

            double shift = sum / used;
            mean += shift;
            sigma = Math.Sqrt(Math.Max((sumSquares / used) - (shift * shift), varianceFloor));
        }

        double c0 = 0;
        double c1 = 0;
        for (int i = from; i < to; i++)
        {
            double e = values[i] - mean;
            c0 += e * e;
            if (i + 1 < to)
            {
                c1 += e * (values[i + 1] - mean);
            }
        }

        double rho = c0 > 0 ? Math.Clamp(c1 / c0, 0, 0.8) : 0;
        double factor = Math.Sqrt((1 + rho) / (1 - rho));
        return new Robust(mean, sigma * factor / Math.Sqrt(used), sigma, used, factor);
    }
}
