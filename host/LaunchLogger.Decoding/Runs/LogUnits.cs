namespace LaunchLogger.Decoding.Runs;

/// <summary>The log's integer units turned into SI, in one place (LOG-FORMAT.md, section 2).</summary>
internal static class LogUnits
{
    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901; ISO 80000-3).</summary>
    public const double StandardGravityMps2 = 9.80665;

    /// <summary>µs → s. A division, so whole microseconds give the nearest double to the exact
    /// value and convert back without loss.</summary>
    public static double Seconds(long micros) => micros / 1e6;

    /// <summary>µm → m.</summary>
    public static double Metres(long micrometres) => micrometres / 1e6;

    /// <summary>milli-g → m/s².</summary>
    public static double Mps2(double milliG) => milliG * StandardGravityMps2 / 1000.0;

    /// <summary><see cref="Mps2"/> of every value an i16 sample can hold, at value + 32768: the
    /// same doubles without a division per sample.</summary>
    public static ReadOnlySpan<double> SampleMps2 => SampleTable;

    private static readonly double[] SampleTable = BuildSampleTable();

    private static double[] BuildSampleTable()
    {
        var table = new double[1 << 16];
        for (int value = short.MinValue; value <= short.MaxValue; value++)
        {
            table[value - short.MinValue] = Mps2(value);
        }

        return table;
    }
}
