using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What <see cref="SlipSwingTest.Measure"/> found over one launch.</summary>
/// <param name="Blocks">Blocks of <see cref="SlipSwingTest.BlockS"/> with enough edges to judge.</param>
/// <param name="Swinging">Of those, the blocks whose residuals pass their χ² quantile.</param>
/// <param name="ExcessSlip">The swing's size: the RMS of the pulses' speed about the smooth fits,
/// beyond what the teeth and edges explain, over the car's speed (0 where they explain it all).</param>
public sealed record SlipSwing(int Blocks, int Swinging, double ExcessSlip)
{
    /// <summary>True when the slip swings through most of the launch: at least
    /// <see cref="SlipSwingTest.LeastBlocks"/> blocks judged and at least half of them swinging.</summary>
    public bool Swings => Blocks >= SlipSwingTest.LeastBlocks && 2 * Swinging >= Blocks;
}

/// <summary>Finds a driven wheel whose slip swings to and fro across its tyre's grip peak — a
/// burst of wheel speed every few tens of milliseconds — where the car's own motion does not.</summary>
/// <remarks>A tyre below the peak of its force–slip curve is stable: more slip brings more force
/// and the wheel settles; past the peak the force falls and the wheel runs up until the tyre bites
/// again (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; from memory). A slip that swings
/// through the launch therefore crosses the peak whatever the peak's slip is — which no threshold
/// on the slip itself can tell from a tyre held at the peak. From <see cref="FromSpeedMps"/>
/// until <see cref="WheelspinDetector.LaunchLongestS"/> after first motion, the pulses' distance
/// at each edge less the accelerometer's (integrated from first motion) is the wheel's lead: a
/// smooth curve for a held tyre (slip, scale and bias change slowly), a ripple on it for a swinging
/// one. Each block of <see cref="BlockS"/> gets a weighted cubic fit; its residuals' χ², each
/// edge weighted by its own σ (the tooth's spacing, <see cref="ReconstructionOptions.ToothSpacingErrorFraction"/>
/// of the pitch, and the edge's time — bracket width over √12 and
/// <see cref="ReconstructionOptions.EdgeJitterS"/> — at the car's speed), follows a χ² law with
/// n − 4 degrees of freedom when the teeth and brackets explain the scatter (the goodness of fit of
/// a weighted least-squares fit: W. H. Press et al., "Numerical Recipes", 3rd ed., §15.1–15.2).
/// A block swings when its χ² passes the law's 1 − <see cref="BlockFalseRate"/> quantile; the
/// launch swings when half its blocks do (at least <see cref="LeastBlocks"/>): a clean launch does
/// that with a chance below C(6,3)·10⁻⁹. A cubic over 0.2 s cannot follow a swing of 30–60 ms
/// (3–7 cycles a block), and a gear change or a slip that fades bends only the block it falls
/// in. Nothing here is tuned on a simulated run.</remarks>
public static class SlipSwingTest
{
    /// <summary>Length of a block, s.</summary>
    public const double BlockS = 0.2;

    /// <summary>Where the test starts: the car's speed from the accelerometer, m/s.</summary>
    public const double FromSpeedMps = 1;

    /// <summary>The chance a block the teeth and brackets explain passes its quantile.</summary>
    public const double BlockFalseRate = 1e-3;

    /// <summary>Fewest blocks a launch is judged on.</summary>
    public const int LeastBlocks = 3;

    /// <summary>Fewest edges a block is judged on (a cubic takes 4).</summary>
    public const int LeastEdges = 8;

    internal static SlipSwing Measure(
        PulseChannel pulses, double mpp, double toothSigmaM, double jitterS, double[] accelT, double[] input, double startS, double endS)
    {
        var integral = new WheelspinDetector.RunningDistance(accelT, input, startS - WheelspinDetector.LaunchLeadInS);
        double lastS = Math.Min(endS, startS + WheelspinDetector.LaunchLongestS);
        var times = new List<double>();
        var leads = new List<double>();
        var variances = new List<double>();
        var speeds = new List<double>();
        long firstCount = 0;
        bool first = true;
        foreach (int i in WheelspinDetector.EdgesIn(pulses, startS, lastS))
        {
            double t = pulses.EdgeS(i);
            double d = integral.At(t, out double v);
            if (v < FromSpeedMps)
            {
                continue;
            }

            if (first)
            {
                firstCount = pulses.Counts[i];
                first = false;
            }

            double edge = v * Math.Sqrt(Square(pulses.EdgeSigmaS(i)) + Square(jitterS));
            times.Add(t);
            leads.Add(((pulses.Counts[i] - firstCount) * mpp) - d);
            variances.Add(Square(toothSigmaM) + Square(edge));
            speeds.Add(v);
        }

        int blocks = 0, swinging = 0;
        double excess = 0, speedSum = 0;
        int excessCount = 0;
        for (int a = 0; a < times.Count;)
        {
            int b = a;
            while (b < times.Count && times[b] < times[a] + BlockS)
            {
                b++;
            }

            int n = b - a;
            if (n >= LeastEdges && times[b - 1] - times[a] > 0.5 * BlockS)
            {
                (double chi2, double sumSquares, double sumVariance) = CubicResiduals(times, leads, variances, a, b);
                int dof = n - 4;
                blocks++;
                if (chi2 > ChiSquared.InvCDF(dof, 1 - BlockFalseRate))
                {
                    swinging++;
                }

                // The swing's size in speed: a lead rippling by δ at a period P swings the speed by
                // about 2π·δ/P; taken at the block's spread beyond the σ claimed, at 45 ms.
                double beyond = Math.Max(0, (sumSquares - sumVariance) / n);
                excess += 2 * Math.PI * Math.Sqrt(beyond) / 0.045;
                for (int k = a; k < b; k++)
                {
                    speedSum += speeds[k];
                }

                excessCount += n;
            }

            a = b;
        }

        double meanSpeed = excessCount > 0 ? speedSum / excessCount : 0;
        return new SlipSwing(blocks, swinging, blocks > 0 && meanSpeed > 0 ? excess / blocks / meanSpeed : 0);
    }

    /// <summary>The weighted cubic fit of <paramref name="leads"/> over [a, b): its χ², its
    /// residuals' sum of squares and the sum of the edges' variances.</summary>
    private static (double Chi2, double SumSquares, double SumVariance) CubicResiduals(List<double> times, List<double> leads, List<double> variances, int a, int b)
    {
        int n = b - a;
        double mid = 0.5 * (times[a] + times[b - 1]);
        double half = Math.Max(0.5 * (times[b - 1] - times[a]), 1e-6);
        Matrix<double> x = Matrix<double>.Build.Dense(n, 4);
        Vector<double> y = Vector<double>.Build.Dense(n);
        for (int k = 0; k < n; k++)
        {
            double u = (times[a + k] - mid) / half;
            double w = 1 / Math.Sqrt(variances[a + k]);
            x[k, 0] = w;
            x[k, 1] = w * u;
            x[k, 2] = w * u * u;
            x[k, 3] = w * u * u * u;
            y[k] = w * leads[a + k];
        }

        Vector<double> c = x.QR().Solve(y);
        Vector<double> r = y - (x * c);
        double sumSquares = 0, sumVariance = 0;
        for (int k = 0; k < n; k++)
        {
            sumSquares += Square(r[k]) * variances[a + k];
            sumVariance += variances[a + k];
        }

        return (r.DotProduct(r), sumSquares, sumVariance);
    }

    private static double Square(double x) => x * x;
}
