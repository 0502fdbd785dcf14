using System.Runtime.InteropServices;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The distance channel's observations as flat arrays, with equal or reversed entries
/// cleaned out, ready for the fits and the filter.</summary>
internal sealed class PulseChannel
{
    private PulseChannel(long[] counts, double[] lo, double[] hi, int dropped)
    {
        Counts = counts;
        LoS = lo;
        HiS = hi;
        Dropped = dropped;
    }

    /// <summary>Cumulative counts, strictly ascending.</summary>
    public long[] Counts { get; }

    /// <summary>Bracket starts, seconds.</summary>
    public double[] LoS { get; }

    /// <summary>Bracket ends, seconds, ascending.</summary>
    public double[] HiS { get; }

    /// <summary>Observations left out because their count or time went backwards.</summary>
    public int Dropped { get; }

    /// <summary>Number of observations.</summary>
    public int Length => Counts.Length;

    /// <summary>Bracket midpoint of observation <paramref name="i"/>, seconds.</summary>
    public double MidS(int i) => 0.5 * (LoS[i] + HiS[i]);

    /// <summary>The first observation whose bracket midpoint is at or after <paramref name="timeS"/>
    /// (<see cref="Length"/> when none is).</summary>
    public int FirstMidAtOrAfter(double timeS)
    {
        int lo = 0;
        int hi = Length;
        while (lo < hi)
        {
            int mid = (lo + hi) >>> 1;
            if (MidS(mid) >= timeS)
            {
                hi = mid;
            }
            else
            {
                lo = mid + 1;
            }
        }

        return lo;
    }

    /// <summary>Count increase at observation <paramref name="i"/> (1 for the first).</summary>
    public long Increment(int i) => i == 0 ? 1 : Counts[i] - Counts[i - 1];

    /// <summary>Pulse period around each observation, s, and its relative uncertainty: counts over
    /// a window of neighbouring observations (at least <see cref="PeriodWindowPulses"/> pulses each
    /// side, or <see cref="PeriodWindowS"/>), centred on the observation so that a steady change
    /// of speed cancels. Read from the counts alone, never from a filter's state, so a bracket
    /// narrowed by it (<see cref="BracketModel"/>) cannot feed an error back into itself.</summary>
    public void PulsePeriod(int i, out double periodS, out double relativeSigma)
    {
        periods ??= PulsePeriods(out periodSigmas);
        periodS = periods[i];
        relativeSigma = periodSigmas![i];
    }

    /// <summary>Best time of the edge at which observation <paramref name="i"/>'s count was
    /// reached: the middle of the interval <see cref="BracketModel.LastEdge"/> leaves in the
    /// bracket, seconds. The bracket's own midpoint for a bracket holding one slow pulse; at speed,
    /// and above all across a long stall of the loop, it is where the edge can have been.</summary>
    public double EdgeS(int i)
    {
        PlaceEdges();
        return edges![i];
    }

    /// <summary>1-σ of <see cref="EdgeS"/>: the interval's width over √12 (uniform), seconds.</summary>
    public double EdgeSigmaS(int i)
    {
        PlaceEdges();
        return edgeSigmas![i];
    }

    private void PlaceEdges()
    {
        if (edges is not null)
        {
            return;
        }

        var result = new double[Length];
        var sigmas = new double[Length];
        for (int k = 0; k < result.Length; k++)
        {
            PulsePeriod(k, out double period, out double sigma);
            BracketModel.LastEdge(LoS[k], HiS[k], Increment(k), period, Math.Min(0.5, sigma), out double from, out double to);
            result[k] = 0.5 * (from + to);
            sigmas[k] = (to - from) / Math.Sqrt(12);
        }

        edgeSigmas = sigmas;
        edges = result;
    }

    private double[]? edges;
    private double[]? edgeSigmas;

    /// <summary>Pulses each side of an observation that <see cref="PulsePeriod"/> counts over.</summary>
    public const int PeriodWindowPulses = 12;

    /// <summary>Longest half-window of <see cref="PulsePeriod"/>, s.</summary>
    public const double PeriodWindowS = 0.05;

    private double[]? periods;
    private double[]? periodSigmas;

    private double[] PulsePeriods(out double[] sigmas)
    {
        int n = Length;
        var result = new double[n];
        sigmas = new double[n];
        int a = 0;
        int b = 0;
        for (int i = 0; i < n; i++)
        {
            // The window [a, b] around i: as many pulses before as after, as far as the data and
            // the time limit allow.
            a = Math.Min(a, i);
            b = Math.Max(b, i);
            while (a > 0 && Counts[i] - Counts[a] < PeriodWindowPulses && HiS[i] - HiS[a - 1] <= PeriodWindowS)
            {
                a--;
            }

            while (a < i && (Counts[i] - Counts[a + 1] >= PeriodWindowPulses || HiS[i] - HiS[a] > PeriodWindowS))
            {
                a++;
            }

            while (b + 1 < n && Counts[b] - Counts[i] < PeriodWindowPulses && HiS[b + 1] - HiS[i] <= PeriodWindowS)
            {
                b++;
            }

            while (b > i && (Counts[b - 1] - Counts[i] >= PeriodWindowPulses || HiS[b] - HiS[i] > PeriodWindowS))
            {
                b--;
            }

            // Symmetric in pulses, so the window's centre is the observation's.
            int before = (int)(Counts[i] - Counts[a]);
            int after = (int)(Counts[b] - Counts[i]);
            int side = Math.Min(before, after);
            int from = a;
            int to = b;
            if (side > 0)
            {
                while (Counts[i] - Counts[from] > side)
                {
                    from++;
                }

                while (Counts[to] - Counts[i] > side)
                {
                    to--;
                }
            }

            // Between poll instants, where the counter's reading is exact: each end is late by
            // less than a pulse period, alike at both ends, whatever the bracket's width (a long
            // stall of the loop included).
            long span = Counts[to] - Counts[from];
            double time = HiS[to] - HiS[from];
            if (span < 2 || !(time > 0))
            {
                result[i] = double.PositiveInfinity;
                sigmas[i] = 1;
                continue;
            }

            result[i] = time / span;
            sigmas[i] = Math.Min(1, 1.0 / span);
        }

        return result;
    }

    /// <summary>Metres per pulse from the configuration (circumference ÷ pulses per revolution
    /// when the direct figure is missing).</summary>
    public static double MetresPerPulse(RunConfiguration configuration)
    {
        if (configuration.MetresPerPulse > 0)
        {
            return configuration.MetresPerPulse;
        }

        return configuration.PulsesPerRevolution > 0 ? configuration.CircumferenceM / configuration.PulsesPerRevolution : 0;
    }

    /// <summary>Copies <paramref name="records"/>, keeping only observations whose count rises
    /// and whose bracket end does not go backwards.</summary>
    public static PulseChannel From(IReadOnlyList<PulseRecord> records)
    {
        // Straight into arrays of the final size, over a span when the list allows one.
        int n = records.Count;
        ReadOnlySpan<PulseRecord> span = records switch
        {
            PulseRecord[] array => array,
            List<PulseRecord> list => CollectionsMarshal.AsSpan(list),
            _ => default,
        };
        bool direct = span.Length == n;
        var counts = new long[n];
        var lo = new double[n];
        var hi = new double[n];
        int kept = 0;
        for (int i = 0; i < n; i++)
        {
            PulseRecord r = direct ? span[i] : records[i];
            if (double.IsNaN(r.LoS) || double.IsNaN(r.HiS) || r.HiS < r.LoS
                || (kept > 0 && (r.Count <= counts[kept - 1] || r.HiS < hi[kept - 1])))
            {
                continue;
            }

            counts[kept] = r.Count;
            lo[kept] = r.LoS;
            hi[kept] = r.HiS;
            kept++;
        }

        if (kept < n)
        {
            Array.Resize(ref counts, kept);
            Array.Resize(ref lo, kept);
            Array.Resize(ref hi, kept);
        }

        return new PulseChannel(counts, lo, hi, n - kept);
    }
}
