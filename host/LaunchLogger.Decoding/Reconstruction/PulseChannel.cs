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
        var counts = new List<long>(records.Count);
        var lo = new List<double>(records.Count);
        var hi = new List<double>(records.Count);
        int dropped = 0;
        foreach (PulseRecord r in records)
        {
            if (double.IsNaN(r.LoS) || double.IsNaN(r.HiS) || r.HiS < r.LoS
                || (counts.Count > 0 && (r.Count <= counts[^1] || r.HiS < hi[^1])))
            {
                dropped++;
                continue;
            }

            counts.Add(r.Count);
            lo.Add(r.LoS);
            hi.Add(r.HiS);
        }

        return new PulseChannel([.. counts], [.. lo], [.. hi], dropped);
    }
}
