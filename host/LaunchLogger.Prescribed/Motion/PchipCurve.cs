using MathNet.Numerics;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>The shape-preserving piecewise cubic through a table (PCHIP: Fritsch &amp; Carlson,
/// SIAM J. Numer. Anal. 17, 1980; slopes as in Moler, Numerical Computing with MATLAB, 2004,
/// §3.4), evaluated with a plain search for its piece.</summary>
/// <remarks>
/// The same numbers as MathNet.Numerics 5's <c>CubicSpline.InterpolatePchipSorted</c>, to the
/// last bit (its tests hold it to that): with hₖ = xₖ₊₁ − xₖ and δₖ = (yₖ₊₁ − yₖ)/hₖ, the
/// slope at an inner knot is 0 where δ changes sign or either is (almost) 0, else the weighted
/// harmonic mean
/// <code>
/// dₖ = (w₁ + w₂) / (w₁/δₖ₋₁ + w₂/δₖ),   w₁ = 2hₖ + hₖ₋₁,  w₂ = hₖ + 2hₖ₋₁
/// </code>
/// the end slopes a one-sided three-point estimate kept to the data's shape, and each piece the
/// cubic Hermite form c₀ + s·(c₁ + s·(c₂ + s·c₃)), s = t − xₖ. MathNet's own curve finds the
/// piece with a generic <see cref="Array.BinarySearch{T}(T[], T)"/> on every call, which the
/// generator's pickup makes millions of times a record.
/// </remarks>
public sealed class PchipCurve
{
    private readonly double[] knots;
    private readonly double[] c0;
    private readonly double[] c1;
    private readonly double[] c2;
    private readonly double[] c3;

    /// <summary>Joins (<paramref name="x"/>, <paramref name="y"/>): at least three points, x
    /// strictly ascending.</summary>
    public PchipCurve(double[] x, double[] y)
    {
        ArgumentNullException.ThrowIfNull(x);
        ArgumentNullException.ThrowIfNull(y);
        if (x.Length < 3 || x.Length != y.Length)
        {
            throw new ArgumentException("at least three points, and as many values as knots");
        }

        int n = x.Length;
        var chord = new double[n - 1];
        for (int k = 0; k < n - 1; k++)
        {
            chord[k] = (y[k + 1] - y[k]) / (x[k + 1] - x[k]);
        }

        var slope = new double[n];
        for (int k = 1; k < n - 1; k++)
        {
            double h = x[k + 1] - x[k];
            double hBefore = x[k] - x[k - 1];
            if (chord[k].AlmostEqual(0.0) || chord[k - 1].AlmostEqual(0.0) || Math.Sign(chord[k]) != Math.Sign(chord[k - 1]))
            {
                slope[k] = 0;
            }
            else
            {
                double w1 = (2 * h) + hBefore;
                double w2 = h + (2 * hBefore);
                slope[k] = (w1 + w2) / ((w1 / chord[k - 1]) + (w2 / chord[k]));
            }
        }

        slope[0] = EndSlope(x[1] - x[0], x[2] - x[1], chord[0], chord[1]);
        slope[n - 1] = EndSlope(x[n - 1] - x[n - 2], x[n - 2] - x[n - 3], chord[n - 2], chord[n - 3]);

        knots = x;
        c0 = new double[n - 1];
        c1 = new double[n - 1];
        c2 = new double[n - 1];
        c3 = new double[n - 1];
        for (int k = 0; k < n - 1; k++)
        {
            double w = x[k + 1] - x[k];
            c0[k] = y[k];
            c1[k] = slope[k];
            c2[k] = ((3 * (y[k + 1] - y[k]) / w) - (2 * slope[k]) - slope[k + 1]) / w;
            c3[k] = ((2 * (y[k] - y[k + 1]) / w) + slope[k] + slope[k + 1]) / (w * w);
        }
    }

    /// <summary>The curve at <paramref name="t"/> (outside the knots, the end pieces go on).</summary>
    public double At(double t)
    {
        int k = PieceAt(t);
        double s = t - knots[k];
        return c0[k] + (s * (c1[k] + (s * (c2[k] + (s * c3[k])))));
    }

    /// <summary>The knot at or before <paramref name="t"/>, kept to [0, n − 2]: the piece
    /// that holds <paramref name="t"/>.</summary>
    internal int PieceAt(double t)
    {
        int lo = 0;
        int hi = knots.Length - 1;
        if (!(t >= knots[0]))
        {
            return 0;
        }

        if (t >= knots[hi])
        {
            return hi - 1;
        }

        // knots[lo] ≤ t < knots[hi]
        while (hi - lo > 1)
        {
            int mid = (lo + hi) >>> 1;
            if (knots[mid] <= t)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        return lo;
    }

    /// <summary>One-sided, shape-preserving three-point slope at an end (Moler 2004, §3.4).</summary>
    private static double EndSlope(double h0, double h1, double m0, double m1)
    {
        double d = (((2 * h0) + h1) * m0 - (h0 * m1)) / (h0 + h1);
        if (Math.Sign(d) != Math.Sign(m0))
        {
            return 0.0;
        }

        if (Math.Sign(m0) != Math.Sign(m1) && Math.Abs(d) > 3 * Math.Abs(m0))
        {
            return 3 * m0;
        }

        return d;
    }
}
