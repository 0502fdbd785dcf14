using static System.FormattableString;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>An acceleration history given as a table (time since the piece began, acceleration),
/// joined by a shape-preserving piecewise cubic (PCHIP: Fritsch &amp; Carlson, SIAM J. Numer.
/// Anal. 17, 1980; <see cref="PchipCurve"/>), which never overshoots the table between its points.</summary>
/// <remarks>Each piece of the interpolant is a cubic, so ∫a and ∫s·a over a piece are polynomials
/// of degree 3 and 4, which a 3-point Gauss–Legendre rule integrates exactly (Abramowitz &amp;
/// Stegun 25.4.29: n points are exact to degree 2n − 1). Sums up to each knot are kept, so a
/// state anywhere costs one partial piece.</remarks>
public sealed class TabulatedSegment : AccelSegment
{
    private static readonly double GaussNode = Math.Sqrt(3.0 / 5.0);
    private const double GaussEdgeWeight = 5.0 / 9.0;
    private const double GaussMidWeight = 8.0 / 9.0;
    private readonly double[] knotsS;
    private readonly PchipCurve curve;
    private readonly double[] speedAtKnot;
    private readonly double[] momentAtKnot;

    /// <summary>Creates the piece from a table starting at time 0.</summary>
    /// <exception cref="ArgumentException">Fewer than two rows, unequal lengths, times not
    /// ascending strictly from 0, or a value not finite.</exception>
    public TabulatedSegment(IReadOnlyList<double> timesS, IReadOnlyList<double> accelsMps2)
        : base(CheckedDuration(timesS, accelsMps2))
    {
        knotsS = [.. timesS];
        double[] values = [.. accelsMps2];
        curve = new PchipCurve(knotsS, values);
        speedAtKnot = new double[knotsS.Length];
        momentAtKnot = new double[knotsS.Length];
        for (int i = 1; i < knotsS.Length; i++)
        {
            speedAtKnot[i] = speedAtKnot[i - 1] + Integrate(knotsS[i - 1], knotsS[i], s => curve.At(s));
            momentAtKnot[i] = momentAtKnot[i - 1] + Integrate(knotsS[i - 1], knotsS[i], s => s * curve.At(s));
        }
    }

    /// <inheritdoc/>
    public override double AccelMps2(double tauS) => curve.At(Math.Clamp(tauS, 0, DurationS));

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => Cumulative(tauS, speedAtKnot, s => curve.At(s));

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS)
    {
        // Δx(τ) = τ·Δv(τ) − ∫₀^τ s·a(s) ds.
        double moment = Cumulative(tauS, momentAtKnot, s => s * curve.At(s));
        return (tauS * SpeedGainMps(tauS)) - moment;
    }

    /// <inheritdoc/>
    public override string Describe() => Invariant($"tabulated, {knotsS.Length} points over {DurationS:0.###} s");

    private static double CheckedDuration(IReadOnlyList<double> timesS, IReadOnlyList<double> accelsMps2)
    {
        ArgumentNullException.ThrowIfNull(timesS);
        ArgumentNullException.ThrowIfNull(accelsMps2);
        if (timesS.Count < 2 || timesS.Count != accelsMps2.Count)
        {
            throw new ArgumentException("a table needs at least two rows and as many accelerations as times");
        }

        if (timesS[0] != 0)
        {
            throw new ArgumentException("a table's times start at 0");
        }

        for (int i = 0; i < timesS.Count; i++)
        {
            if (!double.IsFinite(timesS[i]) || !double.IsFinite(accelsMps2[i]) || (i > 0 && !(timesS[i] > timesS[i - 1])))
            {
                throw new ArgumentException(Invariant($"row {i}: times must ascend strictly and every value be finite"));
            }
        }

        return timesS[^1];
    }

    /// <summary>3-point Gauss–Legendre: nodes 0, ±√(3/5), weights 8/9, 5/9 on [−1, 1]
    /// (Abramowitz &amp; Stegun, table 25.4).</summary>
    private static double Integrate(double a, double b, Func<double, double> f)
    {
        double half = 0.5 * (b - a);
        double mid = 0.5 * (a + b);
        double offset = half * GaussNode;
        return half * ((GaussEdgeWeight * (f(mid - offset) + f(mid + offset))) + (GaussMidWeight * f(mid)));
    }

    private double Cumulative(double tauS, double[] atKnot, Func<double, double> f)
    {
        double t = Math.Clamp(tauS, 0, DurationS);
        int i = curve.PieceAt(t);
        if (t == knotsS[i] || t == knotsS[i + 1])
        {
            return t == knotsS[i] ? atKnot[i] : atKnot[i + 1];
        }

        return atKnot[i] + Integrate(knotsS[i], t, f);
    }
}
