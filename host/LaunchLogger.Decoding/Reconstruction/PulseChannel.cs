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

    /// <summary>Count increase at observation <paramref name="i"/> (1 for the first).</summary>
    public long Increment(int i) => i == 0 ? 1 : Counts[i] - Counts[i - 1];

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
