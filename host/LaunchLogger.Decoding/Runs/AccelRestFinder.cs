namespace LaunchLogger.Decoding.Runs;

/// <summary>Rests between runs in a record with an accelerometer and no pulses: where to cut it.</summary>
/// <remarks>
/// <para>An accelerometer reads the same at rest and at a steady cruise, so a quiet stretch alone
/// is no rest. A stretch is quiet when, over every 0.25 s window in it, the forward reading's
/// mean stays within a band of the level of the rest the record ends in and its spread near the
/// quietest windows' (the sensor's noise), for at least <see cref="RecordSplitter.RestGapS"/>
/// (less a window, which the motion either side spoils). The level is read at the end, not from
/// the quietest windows: a noisy sensor is as noisy at rest as under steady acceleration, so
/// the quietest windows can lie anywhere (the box's still test likewise judges block means,
/// never the samples' spread). The speed in each quiet
/// stretch follows from the rest the record ends in: minus the acceleration (less the quiet
/// level) integrated from there to the end. A quiet stretch is a rest when that speed is within
/// <see cref="RestSpeedMps"/> plus three times what the level's own error makes of it over the
/// time to the end (the level read from the thousands of samples of that final rest: the noise
/// over √n).</para>
/// <para>Only records that end quiet are split (the speed is known nowhere else); a cut falls in
/// the middle of each rest between two stretches of motion. A record may end at a cruise as
/// quiet as a rest: then the speeds from its end are all off by that cruise's, and a cruise
/// before at the same speed would read as a rest. Such a record is not split when any quiet
/// stretch before its end reads clearly backwards (below minus a rest's allowance), as the
/// opening rest of a record that launched and ends cruising does: a car does not reverse within
/// a run.</para>
/// </remarks>
internal static class AccelRestFinder
{
    /// <summary>Window of the running mean and spread, s.</summary>
    private const double WindowS = 0.25;

    /// <summary>A quiet window's mean lies within this of the quiet level, m/s² (about 0.01 g).</summary>
    private const double QuietBandMps2 = 0.1;

    /// <summary>A quiet window's spread is at most this many times the quietest windows'.</summary>
    private const double QuietSpreadRatio = 2.0;

    /// <summary>Speed below which a quiet stretch counts as a rest, m/s (a walking pace: well below
    /// any cruise the record could hold, above the integration's drift over a few runs).</summary>
    public const double RestSpeedMps = 1.0;

    /// <summary>Times at which to cut <paramref name="accel"/>: the middles of its rests between runs.</summary>
    public static IReadOnlyList<double> Cuts(AccelSeries accel)
    {
        int n = accel.Count;
        double[] t = accel.TimeS;
        double[] a = accel.ForwardMps2;
        if (n < 16 || t[^1] - t[0] < 3 * RecordSplitter.RestGapS)
        {
            return [];
        }

        double period = (t[^1] - t[0]) / (n - 1);
        int half = Math.Max(2, (int)Math.Round(0.5 * WindowS / period));
        var mean = new double[n];
        var spread = new double[n];
        double sum = 0;
        double sumSquares = 0;
        int lo = 0;
        int hi = -1;
        for (int i = 0; i < n; i++)
        {
            while (hi < Math.Min(n - 1, i + half))
            {
                hi++;
                sum += a[hi];
                sumSquares += a[hi] * a[hi];
            }

            while (lo < i - half)
            {
                sum -= a[lo];
                sumSquares -= a[lo] * a[lo];
                lo++;
            }

            int count = hi - lo + 1;
            mean[i] = sum / count;
            spread[i] = Math.Sqrt(Math.Max(0, (sumSquares / count) - (mean[i] * mean[i])));
        }

        // The quietest tenth of the (non-overlapping) windows sets the noise; the last window, at
        // the rest the record must end in to be split, sets the level (refined over that rest below).
        int[] order = Enumerable.Range(0, ((n - 1) / half) + 1).Select(w => w * half).OrderBy(i => spread[i]).ToArray();
        int tenth = Math.Max(1, order.Length / 10);
        double noise = spread[order[tenth]];
        double level = mean[n - 1];
        var quiet = new bool[n];
        for (int i = 0; i < n; i++)
        {
            quiet[i] = Math.Abs(mean[i] - level) <= QuietBandMps2 && spread[i] <= QuietSpreadRatio * noise;
        }

        // Quiet stretches of at least the rest gap.
        var stretches = new List<(int From, int To)>();
        for (int i = 0; i < n;)
        {
            if (!quiet[i])
            {
                i++;
                continue;
            }

            int j = i;
            while (j + 1 < n && quiet[j + 1])
            {
                j++;
            }

            // The windows at its ends reach into the motion on either side: a rest of the gap
            // shows quiet for a window less. The record's first and last stretches count at any length.
            if (t[j] - t[i] >= RecordSplitter.RestGapS - WindowS || i == 0 || j == n - 1)
            {
                stretches.Add((i, j));
            }

            i = j + 1;
        }

        if (stretches.Count < 3 || stretches[^1].To != n - 1 || stretches[0].From != 0)
        {
            // Only records that open and end quiet, with a quiet stretch between, may hold several runs.
            return [];
        }

        // The level over the whole final rest.
        int quietSamples = n - stretches[^1].From;
        level = 0;
        for (int i = stretches[^1].From; i < n; i++)
        {
            level += a[i];
        }

        level /= quietSamples;

        // Speed at each sample from the rest at the end, integrating back.
        var speed = new double[n];
        for (int i = n - 2; i >= 0; i--)
        {
            speed[i] = speed[i + 1] - (0.5 * (a[i] + a[i + 1] - (2 * level)) * (t[i + 1] - t[i]));
        }

        double levelSigma = noise / Math.Sqrt(quietSamples);
        var cuts = new List<double>();
        for (int s = 0; s + 1 < stretches.Count; s++)
        {
            (int from, int to) = stretches[s];
            int middle = (from + to) / 2;
            double allowed = RestSpeedMps + (3 * levelSigma * (t[^1] - t[middle]));
            if (speed[middle] < -allowed)
            {
                // Going backwards: the record does not end at rest but at a cruise as steady (its
                // speed unknown), and every speed above is off by it.
                return [];
            }

            if (s > 0 && Math.Abs(speed[middle]) <= allowed)
            {
                cuts.Add(t[middle]);
            }
        }

        return cuts;
    }
}
