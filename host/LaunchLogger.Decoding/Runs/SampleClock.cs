using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
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

    /// <summary>The time of index 0 of <paramref name="segment"/>, seconds: <see cref="TimeOf"/>
    /// is this plus <see cref="PeriodS"/> times the index.</summary>
    internal double OriginS(int segment) => originS[segment];

    /// <summary>Fits the clock to the bursts.</summary>
    /// <param name="bursts">One entry per burst, any order; segments numbered from 0.</param>
    /// <param name="nominalPeriodS">The configured period, used when the bursts are too few
    /// (fewer than four, or fewer than two in every segment).</param>
    /// <exception cref="ArgumentException">No bursts, a negative segment number, or a nominal
    /// period that is not positive.</exception>
    public static SampleClock Fit(IReadOnlyList<BurstReading> bursts, double nominalPeriodS)
    {
        ArgumentNullException.ThrowIfNull(bursts);
        return bursts switch
        {
            BurstReading[] array => Fit(array.AsSpan(), nominalPeriodS),
            List<BurstReading> list => Fit(CollectionsMarshal.AsSpan(list), nominalPeriodS),
            _ => Fit(bursts.ToArray(), nominalPeriodS),
        };
    }

    /// <summary>As <see cref="Fit(IReadOnlyList{BurstReading}, double)"/>, over a span: time and
    /// memory linear in the number of bursts, with scratch rented from the shared pool.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static SampleClock Fit(ReadOnlySpan<BurstReading> bursts, double nominalPeriodS)
    {
        if (bursts.Length == 0)
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

        bool[] activeArray = ScratchArrays.Rent<bool>(bursts.Length);
        double[] residualArray = ScratchArrays.Rent<double>(bursts.Length);
        double[] sumArray = ScratchArrays.Rent<double>(2 * segments);
        int[] countArray = ScratchArrays.Rent<int>(segments);
        try
        {
            Span<bool> active = activeArray.AsSpan(0, bursts.Length);
            Span<double> residuals = residualArray.AsSpan(0, bursts.Length);
            var sums = new SegmentSums(countArray.AsSpan(0, segments), sumArray.AsSpan(0, segments), sumArray.AsSpan(segments, segments));
            active.Fill(true);
            int rejected = 0;
            double period = nominalPeriodS;
            double sigma = nominalPeriodS * NominalRelativeUncertainty;
            bool estimated = false;
            while (true)
            {
                if (!TrySlope(bursts, active, sums, residuals, out double slope, out double slopeSigma))
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
            return new SampleClock(period, sigma, origin, estimated, bursts.Length - rejected, rejected, meanLatency);
        }
        finally
        {
            ScratchArrays.Return(countArray);
            ScratchArrays.Return(sumArray);
            ScratchArrays.Return(residualArray);
            ScratchArrays.Return(activeArray);
        }
    }

    /// <summary>Pooled within-segment least-squares slope and its standard error; on success
    /// <paramref name="residuals"/> holds every burst's residual (NaN in a segment with no
    /// active burst).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static bool TrySlope(ReadOnlySpan<BurstReading> bursts, ReadOnlySpan<bool> active, in SegmentSums segment, Span<double> residuals, out double slope, out double slopeSigma)
    {
        slope = slopeSigma = 0;
        Span<int> n = segment.Count;
        Span<double> meanIndex = segment.MeanIndex;
        Span<double> meanTime = segment.MeanTime;
        n.Clear();
        meanIndex.Clear();
        meanTime.Clear();
        for (int k = 0; k < bursts.Length; k++)
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
        for (int s = 0; s < n.Length; s++)
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
        for (int k = 0; k < bursts.Length; k++)
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
        double sumSquares = 0;
        for (int k = 0; k < bursts.Length; k++)
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
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int DropLateOutliers(ReadOnlySpan<double> residuals, Span<bool> active)
    {
        int kept = 0;
        for (int k = 0; k < residuals.Length; k++)
        {
            if (active[k])
            {
                kept++;
            }
        }

        // MathNet's median works in place on a whole array: one of exactly the active count.
        double[] values = new double[kept];
        kept = 0;
        for (int k = 0; k < residuals.Length; k++)
        {
            if (active[k])
            {
                values[kept++] = residuals[k];
            }
        }

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
    /// one end (the plain minimum of r − P·i would sit early by about |δP|·half the span).
    /// The bursts are bucketed by segment once (a counting sort keeping their order), so the
    /// whole pass is linear in the bursts however many segments there are, plus a sort by index
    /// for a segment whose bursts are not already in index order.</remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double[] Origins(ReadOnlySpan<BurstReading> bursts, ReadOnlySpan<bool> active, int segments, double period, out double meanLatencyS)
    {
        var origin = new double[segments];
        int[] startArray = ScratchArrays.Rent<int>(segments + 1);
        int[] orderArray = ScratchArrays.Rent<int>(bursts.Length);
        long[] keyArray = ScratchArrays.Rent<long>(bursts.Length);
        double[] hullArray = ScratchArrays.Rent<double>(2 * bursts.Length);
        try
        {
            Span<int> start = startArray.AsSpan(0, segments + 1);
            Span<int> order = orderArray.AsSpan(0, bursts.Length);
            start.Clear();
            foreach (BurstReading b in bursts)
            {
                start[b.Segment + 1]++;
            }

            for (int s = 0; s < segments; s++)
            {
                start[s + 1] += start[s];
            }

            for (int k = 0; k < bursts.Length; k++)
            {
                order[start[bursts[k].Segment]++] = k;
            }

            // The fill above moved each start to the next segment's: step them back.
            for (int s = segments; s > 0; s--)
            {
                start[s] = start[s - 1];
            }

            start[0] = 0;
            var hull = new Hull(hullArray.AsSpan(0, bursts.Length), hullArray.AsSpan(bursts.Length, bursts.Length));
            for (int s = 0; s < segments; s++)
            {
                Span<int> all = order[start[s]..start[s + 1]];
                int members = 0;
                foreach (int k in all)
                {
                    if (active[k])
                    {
                        all[members++] = k;
                    }
                }

                if (members == 0)
                {
                    // No active burst: use them all (they are still in order after the loop above).
                    members = all.Length;
                }

                if (members == 0)
                {
                    origin[s] = double.NaN;
                    continue;
                }

                origin[s] = Origin(bursts, all[..members], keyArray.AsSpan(0, members), period, ref hull);
            }
        }
        finally
        {
            ScratchArrays.Return(hullArray);
            ScratchArrays.Return(keyArray);
            ScratchArrays.Return(orderArray);
            ScratchArrays.Return(startArray);
        }

        double latencySum = 0.0;
        foreach (BurstReading b in bursts)
        {
            latencySum += b.ReadS - (period * b.LastIndex) - origin[b.Segment];
        }

        meanLatencyS = latencySum / bursts.Length;
        return origin;
    }

    /// <summary>One segment's origin from its members (indices into <paramref name="bursts"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static double Origin(ReadOnlySpan<BurstReading> bursts, Span<int> members, Span<long> keys, double period, ref Hull hull)
    {
        bool sorted = true;
        for (int m = 0; m < members.Length; m++)
        {
            keys[m] = bursts[members[m]].LastIndex;
            sorted &= m == 0 || keys[m] >= keys[m - 1];
        }

        if (!sorted)
        {
            keys.Sort(members);
        }

        double indexSum = 0;
        foreach (int k in members)
        {
            indexSum += bursts[k].LastIndex;
        }

        double meanIndex = indexSum / members.Length;
        BurstReading first = bursts[members[0]];
        double reference = first.ReadS - (period * first.LastIndex);
        hull.Clear();
        foreach (int k in members)
        {
            BurstReading b = bursts[k];
            hull.Add(b.LastIndex - meanIndex, b.ReadS - (period * b.LastIndex) - reference);
        }

        return reference + hull.At(0);
    }

    /// <summary>Sums per segment for the slope: bursts, then means of index and read time.</summary>
    private readonly ref struct SegmentSums(Span<int> count, Span<double> meanIndex, Span<double> meanTime)
    {
        public Span<int> Count { get; } = count;

        public Span<double> MeanIndex { get; } = meanIndex;

        public Span<double> MeanTime { get; } = meanTime;
    }

    /// <summary>The lower convex hull of points added in order of x (Andrew's monotone chain;
    /// equal x keep their lowest y), over caller-owned storage.</summary>
    private ref struct Hull(Span<double> x, Span<double> y)
    {
        private readonly Span<double> x = x;
        private readonly Span<double> y = y;
        private int count;

        public void Clear() => count = 0;

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public void Add(double px, double py)
        {
            if (count > 0 && x[count - 1] == px)
            {
                if (py >= y[count - 1])
                {
                    return;
                }

                count--;
            }

            while (count >= 2 && Cross(x[count - 2], y[count - 2], x[count - 1], y[count - 1], px, py) <= 0)
            {
                count--;
            }

            x[count] = px;
            y[count] = py;
            count++;
        }

        /// <summary>The hull's height at <paramref name="at"/>: the end points' outside its span.</summary>
        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public readonly double At(double at)
        {
            if (count == 1 || at <= x[0])
            {
                return y[0];
            }

            for (int m = 0; m + 1 < count; m++)
            {
                if (at <= x[m + 1])
                {
                    return y[m] + ((y[m + 1] - y[m]) * (at - x[m]) / (x[m + 1] - x[m]));
                }
            }

            return y[count - 1];
        }

        /// <summary>Positive when o → a → b turns left (counter-clockwise).</summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static double Cross(double ox, double oy, double ax, double ay, double bx, double by)
            => ((ax - ox) * (by - oy)) - ((ay - oy) * (bx - ox));
    }
}
