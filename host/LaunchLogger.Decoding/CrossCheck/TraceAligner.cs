using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Finds the clock offset between another instrument's speed trace and our run by
/// matching the two speed histories.</summary>
/// <remarks>
/// <para>Coarse: the mean squared speed difference over our moving part, sampled every
/// <c>h</c> = min(50 ms, half their sample period), for every lag on a grid of step <c>h</c> that
/// keeps our moving part inside their record; the smallest wins. Fine: over their samples that
/// fall inside our moving part, the sum of squares S(δ) = Σ (v_ours(t_i + δ) − v_i)² is minimised
/// by golden-section search within two coarse steps of the coarse lag, with a speed-dependent
/// scale (theirs ≈ k0·v + k2·v³, v ours) fitted at each lag by linear least squares, so that a
/// calibration difference or our tyre's growth with speed does not pass for a clock shift.</para>
/// <para>Uncertainty: the least-squares result for one parameter,
/// σ_δ² = s² [(JᵀJ)⁻¹]₀₀ with J's columns (k0 + 3 k2 v²)·a, v and v³ at t_i + δ, s² = S/(n − 3) (any text on nonlinear least squares,
/// e.g. Press et al., Numerical Recipes, §15.5, the covariance from the curvature of χ²). It
/// needs acceleration or braking in the window: a steady cruise pins no clock.</para>
/// </remarks>
public static class TraceAligner
{
    private const double MovingMps = 0.5;

    /// <summary>Aligns <paramref name="theirs"/> with our trajectory's moving part.</summary>
    /// <param name="ours">Our reconstructed trajectory.</param>
    /// <param name="fromS">Start of the part to match (our first motion), our clock.</param>
    /// <param name="toS">End of the part to match, our clock.</param>
    /// <param name="theirs">The other instrument's trace.</param>
    /// <exception cref="InputException">Their record does not cover our run, or the run holds
    /// no change of speed to align on.</exception>
    public static TraceAlignment Align(Trajectory ours, double fromS, double toS, SpeedTrace theirs)
    {
        ArgumentNullException.ThrowIfNull(ours);
        ArgumentNullException.ThrowIfNull(theirs);
        double span = toS - fromS;
        if (!(span > 1))
        {
            throw new InputException(theirs.Source, 0, "our run is too short to align another record with (under 1 s of motion)");
        }

        double period = theirs.MedianPeriodS;
        double step = Math.Min(0.05, period / 2);
        int m = (int)Math.Floor(span / step) + 1;
        var gridT = new double[m];
        var gridV = new double[m];
        for (int k = 0; k < m; k++)
        {
            gridT[k] = fromS + (k * step);
            gridV[k] = ours.ValueAt(ours.SpeedMps, gridT[k]);
        }

        double lowest = toS - theirs.TimeS[^1];
        double highest = fromS - theirs.TimeS[0];
        if (lowest > highest)
        {
            throw new InputException(theirs.Source, 0, "the other record does not cover the whole run at any clock offset");
        }

        long lags = (long)Math.Floor((highest - lowest) / step) + 1;
        if (lags * m > 2_000_000_000L)
        {
            throw new InputException(theirs.Source, 0, "the other record is too long to search for the run in; cut it to the session");
        }

        double bestLag = lowest;
        double bestScore = double.PositiveInfinity;
        for (long j = 0; j < lags; j++)
        {
            double lag = lowest + (j * step);
            double score = MeanSquare(gridT, gridV, theirs, lag, bestScore);
            if (score < bestScore)
            {
                bestScore = score;
                bestLag = lag;
            }
        }

        // Their samples inside our moving part (kept fixed through the fine search).
        var used = new List<int>();
        for (int i = 0; i < theirs.Count; i++)
        {
            double t = theirs.TimeS[i] + bestLag;
            if (t >= fromS + (2 * step) && t <= toS - (2 * step))
            {
                used.Add(i);
            }
        }

        if (used.Count < 3)
        {
            throw new InputException(theirs.Source, 0, "too few of the other record's samples fall inside our run to align on");
        }

        // Their speeds may read a little differently from ours throughout: our tyre grows with
        // speed (so a static circumference reads low in proportion to v²), their antenna and
        // filter have their own small scale. theirs ≈ k0·v + k2·v³ (v = ours) is profiled out at
        // each lag by linear least squares, so a speed-dependent scale is not taken for a clock
        // shift while the car accelerates.
        (double K0, double K2, double Sse) Fit(double lag)
        {
            double s11 = 0, s13 = 0, s33 = 0, b1 = 0, b3 = 0, tt = 0;
            foreach (int i in used)
            {
                double v = ours.ValueAt(ours.SpeedMps, theirs.TimeS[i] + lag);
                double v3 = v * v * v;
                double y = theirs.SpeedMps[i];
                s11 += v * v;
                s13 += v * v3;
                s33 += v3 * v3;
                b1 += v * y;
                b3 += v3 * y;
                tt += y * y;
            }

            double det = (s11 * s33) - (s13 * s13);
            if (!(det > 1e-12 * s11 * s33))
            {
                double k = s11 > 0 ? b1 / s11 : 1;
                return (k, 0, Math.Max(0, tt - (k * b1)));
            }

            double k0 = ((b1 * s33) - (b3 * s13)) / det;
            double k2 = ((s11 * b3) - (s13 * b1)) / det;
            return (k0, k2, Math.Max(0, tt - (k0 * b1) - (k2 * b3)));
        }

        double offset = GoldenSection(lag => Fit(lag).Sse, bestLag - (2 * step), bestLag + (2 * step), 1e-6);
        (double k0, double k2, double sse) = Fit(offset);

        // Normal matrix of (offset, k0, k2): columns (k0 + 3 k2 v²)·a, v, v³.
        var normal = new double[3, 3];
        foreach (int i in used)
        {
            double v = ours.ValueAt(ours.SpeedMps, theirs.TimeS[i] + offset);
            double[] j = [(k0 + (3 * k2 * v * v)) * ours.ValueAt(ours.AccelMps2, theirs.TimeS[i] + offset), v, v * v * v];
            for (int r = 0; r < 3; r++)
            {
                for (int c = 0; c < 3; c++)
                {
                    normal[r, c] += j[r] * j[c];
                }
            }
        }

        int n = used.Count;
        double s2 = sse / Math.Max(1, n - 3);
        double offsetVariance = InverseTopLeft(normal);
        if (!(normal[0, 0] > 1e-6) || !(offsetVariance > 0) || !double.IsFinite(offsetVariance))
        {
            throw new InputException(theirs.Source, 0, "the run holds no change of speed to align the two clocks on");
        }

        return new TraceAlignment(offset, Math.Sqrt(s2 * offsetVariance), Math.Sqrt(sse / n), n) { SpeedScale = k0 };
    }

    /// <summary>[M⁻¹]₀₀ of a symmetric 3×3 matrix, by cofactors.</summary>
    private static double InverseTopLeft(double[,] m)
    {
        double c00 = (m[1, 1] * m[2, 2]) - (m[1, 2] * m[2, 1]);
        double c01 = (m[1, 0] * m[2, 2]) - (m[1, 2] * m[2, 0]);
        double c02 = (m[1, 0] * m[2, 1]) - (m[1, 1] * m[2, 0]);
        double det = (m[0, 0] * c00) - (m[0, 1] * c01) + (m[0, 2] * c02);
        return c00 / det;
    }

    private static double MeanSquare(double[] gridT, double[] gridV, SpeedTrace theirs, double lag, double giveUpAbove)
    {
        double[] t = theirs.TimeS;
        double[] v = theirs.SpeedMps;
        int j = 0;
        double sum = 0;
        double limit = giveUpAbove * gridT.Length;
        for (int k = 0; k < gridT.Length; k++)
        {
            if (gridV[k] < MovingMps && k > 0 && k < gridT.Length - 1)
            {
                continue;
            }

            double at = gridT[k] - lag;
            while (j < t.Length - 2 && t[j + 1] < at)
            {
                j++;
            }

            double f = Math.Clamp((at - t[j]) / (t[j + 1] - t[j]), 0, 1);
            double d = gridV[k] - (v[j] + (f * (v[j + 1] - v[j])));
            sum += d * d;
            if (sum > limit)
            {
                return double.PositiveInfinity;
            }
        }

        return sum / gridT.Length;
    }

    private static double GoldenSection(Func<double, double> f, double a, double b, double tolerance)
    {
        double ratio = (Math.Sqrt(5) - 1) / 2;
        double c = b - (ratio * (b - a));
        double d = a + (ratio * (b - a));
        double fc = f(c);
        double fd = f(d);
        while (b - a > tolerance)
        {
            if (fc < fd)
            {
                b = d;
                d = c;
                fd = fc;
                c = b - (ratio * (b - a));
                fc = f(c);
            }
            else
            {
                a = c;
                c = d;
                fc = fd;
                d = a + (ratio * (b - a));
                fd = f(d);
            }
        }

        return (a + b) / 2;
    }
}
