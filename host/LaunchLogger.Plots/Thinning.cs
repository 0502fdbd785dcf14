namespace LaunchLogger.Plots;

/// <summary>Cuts a long trace down to what a picture can show: a trajectory sampled at 1 kHz
/// has tens of thousands of points where the chart is under a thousand pixels wide, and every
/// point would be kept in an SVG. Each of a few buckets per pixel keeps its lowest and highest
/// point (in time order), so peaks and steps survive.</summary>
internal static class Thinning
{
    /// <summary>Buckets per pixel of width.</summary>
    private const int BucketsPerPixel = 1;

    /// <summary>The points to keep of a series spanning <paramref name="widthPx"/> pixels:
    /// all of them when few, otherwise the first, last, and each bucket's extremes.</summary>
    public static int[] Keep(double[] ys, int widthPx)
    {
        int n = ys.Length;
        int buckets = Math.Max(1, widthPx * BucketsPerPixel);
        if (n <= 2 * buckets)
        {
            return Enumerable.Range(0, n).ToArray();
        }

        var keep = new List<int>(2 * buckets + 2) { 0 };
        for (int b = 0; b < buckets; b++)
        {
            int from = (int)((long)b * n / buckets), to = (int)((long)(b + 1) * n / buckets);
            int low = from, high = from;
            for (int i = from + 1; i < to; i++)
            {
                if (ys[i] < ys[low])
                {
                    low = i;
                }

                if (ys[i] > ys[high])
                {
                    high = i;
                }
            }

            keep.Add(Math.Min(low, high));
            keep.Add(Math.Max(low, high));
        }

        keep.Add(n - 1);
        return keep.Distinct().Order().ToArray();
    }

    /// <summary>The given points of a series.</summary>
    public static double[] Pick(double[] values, int[] keep) => Array.ConvertAll(keep, i => values[i]);
}
