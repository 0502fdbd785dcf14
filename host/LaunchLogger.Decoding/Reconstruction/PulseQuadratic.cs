namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Speed and acceleration at one pulse observation from a least-squares quadratic
/// d(t) = d₀ + v·(t − t₀) + a·(t − t₀)²/2 through a run of observations (their midpoints).</summary>
/// <param name="SpeedMps">v at the anchor, m/s.</param>
/// <param name="AccelMps2">a, m/s².</param>
/// <param name="SpeedSigmaMps">σ of v: the fit's covariance scaled by its scatter (at least the
/// distance noise given).</param>
/// <param name="AccelSigmaMps2">σ of a, likewise.</param>
/// <param name="Count">Observations fitted.</param>
internal readonly record struct PulseQuadratic(double SpeedMps, double AccelMps2, double SpeedSigmaMps, double AccelSigmaMps2, int Count)
{
    /// <summary>Fits observations <paramref name="first"/>..<paramref name="last"/> (inclusive),
    /// time and distance measured from observation <paramref name="anchor"/>; null with fewer
    /// than three or a singular fit.</summary>
    /// <param name="pulses">The channel.</param>
    /// <param name="mpp">Metres per pulse.</param>
    /// <param name="first">First observation fitted.</param>
    /// <param name="last">Last observation fitted.</param>
    /// <param name="anchor">Observation whose time is t₀.</param>
    /// <param name="noiseM">Distance noise of one observation (tooth spacing, bracket), m: a floor
    /// under the fit's own scatter.</param>
    public static PulseQuadratic? Fit(PulseChannel pulses, double mpp, int first, int last, int anchor, double noiseM)
    {
        int count = last - first + 1;
        if (count < 3)
        {
            return null;
        }

        double t0 = pulses.MidS(anchor);
        double s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, y0 = 0, y1 = 0, y2 = 0;
        for (int i = first; i <= last; i++)
        {
            double x = pulses.MidS(i) - t0;
            double y = (pulses.Counts[i] - pulses.Counts[anchor]) * mpp;
            s0 += 1;
            s1 += x;
            s2 += x * x;
            s3 += x * x * x;
            s4 += x * x * x * x;
            y0 += y;
            y1 += x * y;
            y2 += x * x * y;
        }

        if (!AccelOnsetFit.SolveSymmetric3(s0, s1, s2, s2, s3, s4, y0, y1, y2, out double c0, out double c1, out double c2))
        {
            return null;
        }

        double residual = 0;
        for (int i = first; i <= last; i++)
        {
            double x = pulses.MidS(i) - t0;
            double r = ((pulses.Counts[i] - pulses.Counts[anchor]) * mpp) - (c0 + (c1 * x) + (c2 * x * x));
            residual += r * r;
        }

        double variance = count > 3 ? Math.Max(residual / (count - 3), noiseM * noiseM) : noiseM * noiseM;

        // Diagonal of (XᵀX)⁻¹ for v and a/2: solve against the unit vectors.
        AccelOnsetFit.SolveSymmetric3(s0, s1, s2, s2, s3, s4, 0, 1, 0, out _, out double inv11, out _);
        AccelOnsetFit.SolveSymmetric3(s0, s1, s2, s2, s3, s4, 0, 0, 1, out _, out _, out double inv22);
        return new PulseQuadratic(c1, 2 * c2, Math.Sqrt(Math.Max(inv11, 0) * variance), 2 * Math.Sqrt(Math.Max(inv22, 0) * variance), count);
    }
}
