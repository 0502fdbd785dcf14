using MathNet.Numerics.Statistics;

namespace LaunchLogger.Decoding.Runs;

/// <summary>The accelerometer's true sample period against the box's clock, estimated from
/// (last index, read time) pairs of its bursts, and the time of any sample index.</summary>
/// <remarks>
/// <para>Model: sample i of segment s was taken at T_s + P·i, and a burst whose newest sample is
/// i was read at r = T_s + P·i + d with a read latency d ≥ 0 (the box reads the FIFO at or after
/// the newest sample: polling, interrupts, a busy logger). The latencies jitter from burst to
/// burst.</para>
/// <para>Period: ordinary least squares of r on i with one intercept per segment and a common
/// slope (the pooled within-segment slope, in closed form over centred sums). As long as the
/// latency does not trend with time, its mean goes into the intercepts and the slope stays
/// unbiased; its 1-σ uncertainty is the slope's standard error from the residual scatter (never
/// below the 1 µs clock's quantisation, 1/√12 µs). Latencies can only be late, so readings far
/// above the line (the logger stalled) are dropped: residuals above median + 6·MAD·1.4826
/// (3 µs at least), refitting until none are left.</para>
/// <para>Time origin: the least-squares line runs through the mean latency, so times read off
/// it would be late by that mean (half the poll period for a polling box). Each segment's origin
/// is therefore moved down to the lower envelope of its readings: the lower convex hull of
/// (i, r − P·i), taken at the segment's mean index, with the fitted slope through it. As bursts
/// accumulate the hull closes in on the true sample times (for latencies spread evenly over
/// [0, J], the lowest of n lie about J/n above zero), and late outliers, being above it, do not
/// move it. What is left is the sensor's own delay between taking and offering a sample, which
/// no reading can show.</para>
/// </remarks>
public sealed class SampleClock
{
    private const double ClockQuantumS = 1e-6;
    private const int MinimumBursts = 4;
    private const double RejectMads = 6.0;
    private const double MadToSigma = 1.4826;
    private const double RejectFloorS = 3e-6;

    private readonly double[] originS;

    private SampleClock(double periodS, double periodSigmaS, double[] originS, bool estimated, int used, int rejected, double meanLatencyS)
    {
        PeriodS = periodS;
        PeriodSigmaS = periodSigmaS;
        this.originS = originS;
        Estimated = estimated;
        BurstsUsed = used;
        BurstsRejected = rejected;
        MeanReadLatencyS = meanLatencyS;
    }

    /// <summary>Relative 1-σ uncertainty given to a nominal period when it cannot be estimated.
    /// From memory: MEMS accelerometer data sheets state output data rate tolerances of a few
    /// per cent for their internal oscillators.</summary>
    public const double NominalRelativeUncertainty = 0.05;

    /// <summary>The sample period, seconds.</summary>
    public double PeriodS { get; }

    /// <summary>1-σ uncertainty of <see cref="PeriodS"/>, seconds.</summary>
    public double PeriodSigmaS { get; }

    /// <summary>False when there were too few bursts and the nominal period is used.</summary>
    public bool Estimated { get; }

    /// <summary>Bursts the period was fitted to.</summary>
    public int BurstsUsed { get; }

    /// <summary>Bursts dropped as late outliers.</summary>
    public int BurstsRejected { get; }

    /// <summary>How far, on average, the read times lie above the lower envelope, seconds: what
    /// sample times taken straight from the least-squares line would have been late by.</summary>
    public double MeanReadLatencyS { get; }

    /// <summary>Number of segments.</summary>
    public int SegmentCount => originS.Length;

    /// <summary>The time of sample <paramref name="index"/> of <paramref name="segment"/>, seconds.</summary>
    public double TimeOf(long index, int segment) => originS[segment] + (PeriodS * index);

    /// <summary>Fits the clock to the bursts.</summary>
    /// <param name="bursts">One entry per burst, any order; segments numbered from 0.</param>
    /// <param name="nominalPeriodS">The configured period, used when the bursts are too few
    /// (fewer than four, or fewer than two in every segment).</param>
    /// <exception cref="ArgumentException">No bursts, a negative segment number, or a nominal
    /// period that is not positive.</exception>
    public static SampleClock Fit(IReadOnlyList<BurstReading> bursts, double nominalPeriodS)
    {
        ArgumentNullException.ThrowIfNull(bursts);
        if (bursts.Count == 0)
        {
            throw new ArgumentException("at least one burst is needed", nameof(bursts));
        }

        if (!(nominalPeriodS > 0) || double.IsInfinity(nominalPeriodS))
        {
            throw new ArgumentException("the nominal period must be positive", nameof(nominalPeriodS));
        }

        int segments = 0;
        foreach (BurstReading b in bursts)
        {
            if (b.Segment < 0)
            {
                throw new ArgumentException("segment numbers start at 0", nameof(bursts));
            }

            segments = Math.Max(segments, b.Segment + 1);
        }

        bool[] active = new bool[bursts.Count];
        Array.Fill(active, true);
        int rejected = 0;
        double period = nominalPeriodS;
        double sigma = nominalPeriodS * NominalRelativeUncertainty;
        bool estimated = false;
        while (true)
        {
            if (!TrySlope(bursts, active, segments, out double slope, out double slopeSigma, out double[] residuals))
            {
                break;
            }

            period = slope;
            sigma = slopeSigma;
            estimated = true;
            int dropped = DropLateOutliers(residuals, active);
            if (dropped == 0)
            {
                break;
            }

            rejected += dropped;
        }

        double[] origin = Origins(bursts, active, segments, period, out double meanLatency);
        return new SampleClock(period, sigma, origin, estimated, bursts.Count - rejected, rejected, meanLatency);
    }

    /// <summary>Pooled within-segment least-squares slope and its standard error.</summary>
    private static bool TrySlope(IReadOnlyList<BurstReading> bursts, bool[] active, int segments, out double slope, out double slopeSigma, out double[] residuals)
    {
        slope = slopeSigma = 0;
        residuals = [];
        var n = new int[segments];
        var meanIndex = new double[segments];
        var meanTime = new double[segments];
        for (int k = 0; k < bursts.Count; k++)
        {
            if (active[k])
            {
                BurstReading b = bursts[k];
                n[b.Segment]++;
                meanIndex[b.Segment] += b.LastIndex;
                meanTime[b.Segment] += b.ReadS;
            }
        }

        int used = 0;
        int segmentsUsed = 0;
        for (int s = 0; s < segments; s++)
        {
            if (n[s] > 0)
            {
                meanIndex[s] /= n[s];
                meanTime[s] /= n[s];
                used += n[s];
                segmentsUsed++;
            }
        }

        int degreesOfFreedom = used - segmentsUsed - 1;
        if (used < MinimumBursts || degreesOfFreedom < 1)
        {
            return false;
        }

        double sxx = 0;
        double sxy = 0;
        for (int k = 0; k < bursts.Count; k++)
        {
            if (active[k])
            {
                BurstReading b = bursts[k];
                double dx = b.LastIndex - meanIndex[b.Segment];
                sxx += dx * dx;
                sxy += dx * (b.ReadS - meanTime[b.Segment]);
            }
        }

        if (!(sxx > 0) || !(sxy > 0))
        {
            return false;
        }

        slope = sxy / sxx;
        residuals = new double[bursts.Count];
        double sumSquares = 0;
        for (int k = 0; k < bursts.Count; k++)
        {
            BurstReading b = bursts[k];
            double e = b.ReadS - meanTime[b.Segment] - (slope * (b.LastIndex - meanIndex[b.Segment]));
            residuals[k] = n[b.Segment] > 0 ? e : double.NaN;
            if (active[k])
            {
                sumSquares += e * e;
            }
        }

        double residualSigma = Math.Max(Math.Sqrt(sumSquares / degreesOfFreedom), ClockQuantumS / Math.Sqrt(12));
        slopeSigma = residualSigma / Math.Sqrt(sxx);
        return true;
    }

    /// <summary>Marks readings far above the line inactive; returns how many.</summary>
    private static int DropLateOutliers(double[] residuals, bool[] active)
    {
        var kept = new List<double>(residuals.Length);
        for (int k = 0; k < residuals.Length; k++)
        {
            if (active[k])
            {
                kept.Add(residuals[k]);
            }
        }

        double[] values = kept.ToArray();
        double median = ArrayStatistics.MedianInplace(values);
        for (int k = 0; k < values.Length; k++)
        {
            values[k] = Math.Abs(values[k] - median);
        }

        double mad = ArrayStatistics.MedianInplace(values);
        double limit = median + Math.Max(RejectMads * MadToSigma * mad, RejectFloorS);
        int dropped = 0;
        for (int k = 0; k < residuals.Length; k++)
        {
            if (active[k] && residuals[k] > limit)
            {
                active[k] = false;
                dropped++;
            }
        }

        return dropped;
    }

    /// <summary>Each segment's time of index 0: the line of the fitted slope through the lower
    /// envelope of the segment's readings at their mean index.</summary>
    /// <remarks>With the slope fixed, sample times are read time minus latency, so the readings
    /// minus P·i scatter above the true origin. The lower convex hull of (i, r − P·i) is the
    /// tightest line under all of them; taken at the mean index it is pinned by the readings on
    /// both sides, so a small error in P tilts it about the middle instead of dragging it down at
    /// one end (the plain minimum of r − P·i would sit early by about |δP|·half the span).</remarks>
    private static double[] Origins(IReadOnlyList<BurstReading> bursts, bool[] active, int segments, double period, out double meanLatencyS)
    {
        var origin = new double[segments];
        var latencySum = 0.0;
        for (int s = 0; s < segments; s++)
        {
            List<int> members = Enumerable.Range(0, bursts.Count).Where(k => bursts[k].Segment == s && active[k]).ToList();
            if (members.Count == 0)
            {
                members = Enumerable.Range(0, bursts.Count).Where(k => bursts[k].Segment == s).ToList();
            }

            if (members.Count == 0)
            {
                origin[s] = double.NaN;
                continue;
            }

            members.Sort((a, b) => bursts[a].LastIndex.CompareTo(bursts[b].LastIndex));
            double meanIndex = members.Average(k => (double)bursts[k].LastIndex);
            double reference = bursts[members[0]].ReadS - (period * bursts[members[0]].LastIndex);
            var points = members.Select(k => (X: bursts[k].LastIndex - meanIndex, Y: bursts[k].ReadS - (period * bursts[k].LastIndex) - reference)).ToList();
            origin[s] = reference + LowerHullAt(points, 0);
        }

        foreach (BurstReading b in bursts)
        {
            latencySum += b.ReadS - (period * b.LastIndex) - origin[b.Segment];
        }

        meanLatencyS = latencySum / bursts.Count;
        return origin;
    }

    /// <summary>The lower convex hull of points sorted by x, evaluated at <paramref name="x"/>
    /// (Andrew's monotone chain; equal x keep their lowest y).</summary>
    private static double LowerHullAt(List<(double X, double Y)> points, double x)
    {
        var hull = new List<(double X, double Y)>(points.Count);
        foreach ((double X, double Y) p in points)
        {
            if (hull.Count > 0 && hull[^1].X == p.X)
            {
                if (p.Y >= hull[^1].Y)
                {
                    continue;
                }

                hull.RemoveAt(hull.Count - 1);
            }

            while (hull.Count >= 2 && Cross(hull[^2], hull[^1], p) <= 0)
            {
                hull.RemoveAt(hull.Count - 1);
            }

            hull.Add(p);
        }

        if (hull.Count == 1 || x <= hull[0].X)
        {
            return hull[0].Y;
        }

        for (int m = 0; m + 1 < hull.Count; m++)
        {
            (double x0, double y0) = hull[m];
            (double x1, double y1) = hull[m + 1];
            if (x <= x1)
            {
                return y0 + ((y1 - y0) * (x - x0) / (x1 - x0));
            }
        }

        return hull[^1].Y;
    }

    /// <summary>Positive when o → a → b turns left (counter-clockwise).</summary>
    private static double Cross((double X, double Y) o, (double X, double Y) a, (double X, double Y) b)
        => ((a.X - o.X) * (b.Y - o.Y)) - ((a.Y - o.Y) * (b.X - o.X));
}
