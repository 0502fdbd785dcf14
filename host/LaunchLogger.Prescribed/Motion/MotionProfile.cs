using MathNet.Numerics.RootFinding;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>A complete prescribed trajectory: segments end to end from time 0, each integrated
/// exactly (closed form) or to within 1e-13 (quadrature), and the crossing times of any distance
/// or speed found by root-finding on that trajectory itself.</summary>
/// <remarks>Roots are bracketed by sampling each segment and refined by Brent's method (Brent,
/// Algorithms for Minimization without Derivatives, 1973, ch. 4) to 1e-12 s, as MathNet.Numerics
/// implements it. Before time 0 the record's first state holds; after the last segment the car
/// keeps its final speed with no acceleration.</remarks>
public sealed class MotionProfile
{
    /// <summary>How closely a root is located, s.</summary>
    public const double RootToleranceS = 1e-12;

    private const int BracketSamples = 64;
    private const int MaxIterations = 200;
    private readonly double[] startTimes;

    internal MotionProfile(IReadOnlyList<PlacedSegment> segments, IReadOnlyList<RunMarks> runs)
    {
        Segments = segments;
        Runs = runs;
        startTimes = segments.Select(s => s.StartS).ToArray();
    }

    /// <summary>The segments in time order.</summary>
    public IReadOnlyList<PlacedSegment> Segments { get; }

    /// <summary>The runs the builder marked (launch or rolling start, brake onset, standstill).</summary>
    public IReadOnlyList<RunMarks> Runs { get; }

    /// <summary>When the last segment ends, s.</summary>
    public double EndS => Segments[^1].EndS;

    /// <summary>Speed at time 0, m/s.</summary>
    public double StartSpeedMps => Segments[0].StartSpeedMps;

    /// <summary>The state at <paramref name="timeS"/>.</summary>
    public MotionState StateAt(double timeS)
    {
        if (timeS <= 0)
        {
            MotionState first = Segments[0].StateAt(0);
            return first with { TimeS = timeS, AccelMps2 = Segments[0].AtRest ? 0 : first.AccelMps2 };
        }

        if (timeS >= EndS)
        {
            MotionState last = Segments[^1].StateAt(Segments[^1].DurationS);
            return new MotionState(timeS, last.DistanceM + (last.SpeedMps * (timeS - EndS)), last.SpeedMps, 0);
        }

        PlacedSegment s = SegmentAt(timeS);
        return s.StateAt(timeS - s.StartS) with { TimeS = timeS };
    }

    /// <summary>The first time at or after <paramref name="afterS"/> at which the distance reaches
    /// <paramref name="distanceM"/>; null when it never does within the record.</summary>
    /// <remarks>Distance never decreases, so the crossing is bracketed by stepping forward from
    /// <paramref name="afterS"/> in steps that double from the time the current speed needs
    /// (fast for a run of nearby crossings, such as one per pulse), then refined by Brent's method.</remarks>
    public double? TimeAtDistance(double distanceM, double afterS = 0)
    {
        double lo = Math.Max(0, afterS);
        MotionState at = StateAt(lo);
        if (at.DistanceM >= distanceM)
        {
            return lo;
        }

        for (int i = FirstSegmentEndingAfter(lo); i < Segments.Count; i++)
        {
            PlacedSegment s = Segments[i];
            if (s.AtRest || s.StateAt(s.DurationS).DistanceM < distanceM)
            {
                lo = Math.Max(lo, s.EndS);
                continue;
            }

            Func<double, double> g = t => s.StateAt(t - s.StartS).DistanceM - distanceM;
            double from = Math.Max(lo, s.StartS);
            MotionState start = s.StateAt(from - s.StartS);
            double step = Math.Max(1e-6, (distanceM - start.DistanceM) / Math.Max(start.SpeedMps, 1e-3));
            double hi = Math.Min(s.EndS, from + step);
            while (g(hi) < 0)
            {
                from = hi;
                step *= 2;
                hi = Math.Min(s.EndS, hi + step);
            }

            return Brent.FindRoot(g, from, hi, RootToleranceS, MaxIterations);
        }

        return null;
    }

    /// <summary>The first time at or after <paramref name="afterS"/> at which the speed rises to
    /// <paramref name="speedMps"/> (or falls to it, with <paramref name="rising"/> false); null
    /// when it never does within the record.</summary>
    public double? TimeAtSpeed(double speedMps, double afterS = 0, bool rising = true) =>
        rising ? FirstCrossing(afterS, s => s.SpeedMps, speedMps) : FirstCrossing(afterS, s => -s.SpeedMps, -speedMps);

    /// <summary>The first time at or after <paramref name="afterS"/> at which
    /// <paramref name="value"/> of the state reaches <paramref name="target"/> from below.</summary>
    /// <remarks>Each segment is sampled at <see cref="BracketSamples"/> points; a crossing is
    /// then refined by Brent's method. A value already at or above the target at
    /// <paramref name="afterS"/> returns <paramref name="afterS"/>.</remarks>
    public double? FirstCrossing(double afterS, Func<MotionState, double> value, double target)
    {
        double t0 = Math.Max(0, afterS);
        if (value(StateAt(t0)) >= target)
        {
            return t0;
        }

        foreach (PlacedSegment s in Segments)
        {
            if (s.EndS <= t0)
            {
                continue;
            }

            double lo = Math.Max(s.StartS, t0);
            double span = s.EndS - lo;
            double previousT = lo;
            for (int k = 1; k <= BracketSamples; k++)
            {
                double t = k == BracketSamples ? s.EndS : lo + (span * k / BracketSamples);
                double f = value(s.StateAt(t - s.StartS)) - target;
                if (f >= 0)
                {
                    double startT = previousT;
                    Func<double, double> g = x => value(s.StateAt(x - s.StartS)) - target;
                    return g(startT) >= 0 ? startT : Brent.FindRoot(g, startT, t, RootToleranceS, MaxIterations);
                }

                previousT = t;
            }
        }

        return null;
    }

    private int FirstSegmentEndingAfter(double timeS)
    {
        int i = Array.BinarySearch(startTimes, timeS);
        return Math.Max(0, i < 0 ? ~i - 1 : i);
    }

    private PlacedSegment SegmentAt(double timeS)
    {
        int i = Array.BinarySearch(startTimes, timeS);
        if (i < 0)
        {
            i = ~i - 1;
        }

        return Segments[Math.Clamp(i, 0, Segments.Count - 1)];
    }
}
