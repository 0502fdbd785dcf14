namespace LaunchLogger.Cli.Bench;

/// <summary>Order statistics of benchmark errors.</summary>
public static class Percentiles
{
    /// <summary>Absolute values of the finite errors, scaled, ascending.</summary>
    public static double[] AbsSorted(IEnumerable<double?> errors, double scale = 1) =>
        errors.Where(e => e is not null && double.IsFinite(e.Value)).Select(e => Math.Abs(e!.Value) * scale).OrderBy(x => x).ToArray();

    /// <summary>Nearest-rank percentile of an ascending array (NaN when empty).</summary>
    public static double Of(double[] sorted, double p) =>
        sorted.Length == 0 ? double.NaN : sorted[Math.Clamp((int)Math.Ceiling(p * sorted.Length) - 1, 0, sorted.Length - 1)];

    /// <summary>The largest value of an ascending array (NaN when empty).</summary>
    public static double Max(double[] sorted) => sorted.Length == 0 ? double.NaN : sorted[^1];
}
