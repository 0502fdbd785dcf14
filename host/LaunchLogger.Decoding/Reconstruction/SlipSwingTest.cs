using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What <see cref="SlipSwingTest.Measure"/> found over one launch.</summary>
/// <param name="Blocks">Blocks of <see cref="SlipSwingTest.BlockS"/> with enough edges to judge.</param>
/// <param name="Swinging">Of those, the blocks whose residuals pass their χ² quantile.</param>
/// <param name="ExcessSlip">The swing's size: the RMS of the pulses' speed about the smooth fits,
/// beyond what the teeth and edges explain, over the car's speed (0 where they explain it all).</param>
/// <param name="SlipPerMps2">k of the tyre's slip k·a that the launch's leads follow (the
/// regression <see cref="SlipSwingTest.Measure"/> takes out before its χ²), s²/m; 0 where none is found.</param>
/// <param name="ChiSquare">The χ² of every judged block together (each block's residuals about its
/// cubic and the launch's k, each edge over its own σ).</param>
/// <param name="DegreesOfFreedom">Its degrees of freedom: the blocks' n − 4 less the one k's.</param>
public sealed record SlipSwing(int Blocks, int Swinging, double ExcessSlip, double SlipPerMps2 = 0, double ChiSquare = 0, double DegreesOfFreedom = 0)
{
    /// <summary>True when the slip swings through most of the launch block by block
    /// (<see cref="SwingsByBlocks"/>) or through the launch as a whole (<see cref="SwingsAsAWhole"/>).</summary>
    public bool Swings => SwingsByBlocks || SwingsAsAWhole;

    /// <summary>True when at least <see cref="SlipSwingTest.LeastBlocks"/> blocks are judged and
    /// at least half of them swing.</summary>
    public bool SwingsByBlocks => Blocks >= SlipSwingTest.LeastBlocks && 2 * Swinging >= Blocks;

    /// <summary>True when the blocks' χ² together passes its law's 1 − <see cref="SlipSwingTest.LaunchFalseRate"/>
    /// quantile on their degrees of freedom together: a swing that no block shows alone (too few
    /// edges a block, or brackets wide enough to hide it in each) but every block carries.</summary>
    public bool SwingsAsAWhole => DegreesOfFreedom > 0 && ChiSquare > ChiSquared.InvCDF(DegreesOfFreedom, 1 - SlipSwingTest.LaunchFalseRate);
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
/// one. A tyre below its peak slips in proportion to the force it passes, κ = k·a (same sources),
/// so on a driveline that shunts its slip ripples with the car's acceleration (k·A·v/ω, about 1 mm
/// at 5 m/s and 5–10 Hz, which a cubic over 0.2 s cannot follow): the lead then carries
/// k·∫ v·a dτ, which with v the accelerometer's own integral is k·v²/2 (the chain rule). One k
/// for the launch — one tyre, one slip stiffness, so a block cannot bend k to its own ripple — is
/// fitted jointly with the blocks' cubics (by the Frisch–Waugh–Lovell theorem, the regression of
/// the lead's residuals about the cubics on v²/2's: W. H. Greene, "Econometric Analysis", §3.3;
/// from memory), held within [0, peak slip ÷ the launch's mean acceleration] (a driven tyre's
/// slip grows with its force and, below its peak, stays under the peak's slip), and taken out
/// before the χ². A slip that swings across the peak does not follow the force and stays.
/// Each block of <see cref="BlockS"/> gets a weighted cubic fit; its residuals' χ², each
/// edge weighted by its own σ (the tooth's spacing, <see cref="ReconstructionOptions.ToothSpacingErrorFraction"/>
/// of the pitch, and the edge's time — bracket width over √12 and
/// <see cref="ReconstructionOptions.EdgeJitterS"/> — at the car's speed), follows a χ² law with
/// n − 4 degrees of freedom, less the block's share of the one k (its part of Σ x̃², x̃ the
/// weighted v²/2 about the cubics) where k is fitted inside its bounds, when the teeth and
/// brackets explain the scatter (the goodness of fit of
/// a weighted least-squares fit: W. H. Press et al., "Numerical Recipes", 3rd ed., §15.1–15.2).
/// A block swings when its χ² passes the law's 1 − <see cref="BlockFalseRate"/> quantile; the
/// launch swings when half its blocks do (at least <see cref="LeastBlocks"/>): a clean launch does
/// that with a chance below C(6,3)·10⁻⁹. The blocks' χ² summed is χ² on their degrees of
/// freedom summed (a sum of independent χ² variables; Press et al., §6.2, and any statistics
/// text), so the launch also swings when that sum passes its 1 − <see cref="LaunchFalseRate"/>
/// quantile: a swing of a few edges' σ in every block — a 12-tooth wheel's two or three blocks,
/// or a ring polled every 1–3 ms whose brackets hide the swing in each block alone — adds up
/// over the launch where no block passes its own quantile. A cubic over 0.2 s cannot follow a swing of 30–60 ms
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

    /// <summary>The chance a launch whose blocks the teeth and brackets explain passes the
    /// quantile of its blocks' χ² together (<see cref="SlipSwing.SwingsAsAWhole"/>): one test of
    /// the whole launch, so one clean launch in 10,000 doubted by chance where the σ are honest.</summary>
    public const double LaunchFalseRate = 1e-4;

    /// <summary>Fewest blocks a launch is judged on by its blocks one by one.</summary>
    public const int LeastBlocks = 3;

    /// <summary>Fewest edges a block is judged on (a cubic takes 4).</summary>
    public const int LeastEdges = 8;

    internal static SlipSwing Measure(
        PulseChannel pulses, double mpp, double toothSigmaM, double jitterS, double[] accelT, double[] input, double startS, double endS, double peakSlip)
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

        // Each block's cubic is projected out of the lead and of the slip regressor v²/2 (the
        // Frisch–Waugh–Lovell theorem: the shared k of the joint least squares is the regression
        // of the one's residuals on the other's); then one k for the launch.
        // With v the accelerometer's own integral, ∫ v·a dτ = v²/2 (the chain rule).
        List<double> halfSquares = speeds.ConvertAll(v => 0.5 * v * v);
        var fits = new List<BlockResiduals>();
        for (int a = 0; a < times.Count;)
        {
            int b = a;
            while (b < times.Count && times[b] < times[a] + BlockS)
            {
                b++;
            }

            if (b - a >= LeastEdges && times[b - 1] - times[a] > 0.5 * BlockS)
            {
                fits.Add(CubicResiduals(times, leads, halfSquares, variances, a, b));
            }

            a = b;
        }

        // Below its peak the tyre's slip k·a stays under the peak's slip: k at most the peak's
        // slip over the launch's mean acceleration here (a looser bound than over its largest).
        double meanAccel = times.Count > 1 && times[^1] > times[0] ? (speeds[^1] - speeds[0]) / (times[^1] - times[0]) : 0;
        double slipPerMps2 = SlipPerMps2(fits, meanAccel > 0 ? peakSlip / meanAccel : 0, out double sxx, out bool free);
        int blocks = fits.Count, swinging = 0;
        double excess = 0, speedSum = 0, chi2Sum = 0, dofSum = 0;
        int excessCount = 0;
        foreach (BlockResiduals fit in fits)
        {
            int n = fit.Lead.Count;
            double chi2 = 0, sumSquares = 0, sumVariance = 0, share = 0;
            for (int k = 0; k < n; k++)
            {
                double r = fit.Lead[k] - (slipPerMps2 * fit.Regressor[k]);
                chi2 += r * r;
                sumSquares += r * r * variances[fit.First + k];
                sumVariance += variances[fit.First + k];
                share += free ? fit.Regressor[k] * fit.Regressor[k] / sxx : 0;
            }

            // The launch's k takes one degree of freedom, shared among the blocks by their
            // leverage on it (each block's share of Σ x̃²); its χ² has n − 4 − share. A k held
            // at a bound is fixed, not fitted, and takes none.
            double dof = n - 4 - share;
            chi2Sum += chi2;
            dofSum += dof;
            if (chi2 > ChiSquared.InvCDF(dof, 1 - BlockFalseRate))
            {
                swinging++;
            }

            // The swing's size in speed: a lead rippling by δ at a period P swings the speed by
            // about 2π·δ/P; taken at the block's spread beyond the σ claimed, at 45 ms.
            double beyond = Math.Max(0, (sumSquares - sumVariance) / n);
            excess += 2 * Math.PI * Math.Sqrt(beyond) / 0.045;
            for (int k = fit.First; k < fit.First + n; k++)
            {
                speedSum += speeds[k];
            }

            excessCount += n;
        }

        double meanSpeed = excessCount > 0 ? speedSum / excessCount : 0;
        return new SlipSwing(blocks, swinging, blocks > 0 && meanSpeed > 0 ? excess / blocks / meanSpeed : 0, slipPerMps2, chi2Sum, dofSum);
    }

    /// <summary>One block's weighted residuals (each over its edge's σ) about its cubic: of the
    /// lead and of the slip regressor.</summary>
    private sealed record BlockResiduals(int First, Vector<double> Lead, Vector<double> Regressor);

    /// <summary>The launch's slip per unit acceleration: the weighted regression of the leads'
    /// residuals on the regressor's, through zero, held within [0, <paramref name="most"/>] (a
    /// driven tyre's slip grows with its force, and below its peak stays under the peak's slip);
    /// <paramref name="sxx"/> is Σ x̃², <paramref name="free"/> whether k lies inside its bounds.</summary>
    private static double SlipPerMps2(List<BlockResiduals> fits, double most, out double sxx, out bool free)
    {
        double sxy = 0;
        sxx = 0;
        foreach (BlockResiduals fit in fits)
        {
            sxy += fit.Regressor.DotProduct(fit.Lead);
            sxx += fit.Regressor.DotProduct(fit.Regressor);
        }

        double k = sxx > 0 ? sxy / sxx : 0;
        free = k > 0 && k < most;
        return Math.Clamp(k, 0, Math.Max(most, 0));
    }

    /// <summary>The weighted residuals of <paramref name="leads"/> and <paramref name="regressor"/>
    /// over [a, b) about their weighted cubic fits.</summary>
    private static BlockResiduals CubicResiduals(List<double> times, List<double> leads, List<double> regressor, List<double> variances, int a, int b)
    {
        int n = b - a;
        double mid = 0.5 * (times[a] + times[b - 1]);
        double half = Math.Max(0.5 * (times[b - 1] - times[a]), 1e-6);
        Matrix<double> x = Matrix<double>.Build.Dense(n, 4);
        Vector<double> y = Vector<double>.Build.Dense(n);
        Vector<double> z = Vector<double>.Build.Dense(n);
        for (int k = 0; k < n; k++)
        {
            double u = (times[a + k] - mid) / half;
            double w = 1 / Math.Sqrt(variances[a + k]);
            x[k, 0] = w;
            x[k, 1] = w * u;
            x[k, 2] = w * u * u;
            x[k, 3] = w * u * u * u;
            y[k] = w * leads[a + k];
            z[k] = w * regressor[a + k];
        }

        var qr = x.QR();
        return new BlockResiduals(a, y - (x * qr.Solve(y)), z - (x * qr.Solve(z)));
    }

    private static double Square(double x) => x * x;
}
