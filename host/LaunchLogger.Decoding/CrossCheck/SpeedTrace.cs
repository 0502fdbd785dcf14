namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Another instrument's record of the same drive: speed (and, where it has them,
/// positions) at its own sample times, on its own clock.</summary>
/// <remarks>Times are seconds on the other instrument's axis (for a satellite receiver, UTC
/// seconds from the first day in the file); they ascend strictly. Speeds are m/s over ground.
/// Positions, when present, are metres east and north of the first fix on a local flat
/// projection, which is exact enough over a strip's length.</remarks>
public sealed class SpeedTrace
{
    /// <summary>Sample times on the other instrument's clock, s, ascending.</summary>
    public required double[] TimeS { get; init; }

    /// <summary>Speed over ground, m/s.</summary>
    public required double[] SpeedMps { get; init; }

    /// <summary>Metres east of the first fix, or null when the file has no positions.</summary>
    public double[]? EastM { get; init; }

    /// <summary>Metres north of the first fix, or null when the file has no positions.</summary>
    public double[]? NorthM { get; init; }

    /// <summary>Whether the speeds came from the file (true) or were differenced from positions.</summary>
    public required bool SpeedMeasured { get; init; }

    /// <summary>What the file was, for the report (format and name).</summary>
    public required string Source { get; init; }

    /// <summary>Lines or records read, accepted or not.</summary>
    public int RecordsRead { get; init; }

    /// <summary>Records refused (bad checksum, no fix, unreadable fields), each counted once.</summary>
    public int RecordsRejected { get; init; }

    /// <summary>Number of samples.</summary>
    public int Count => TimeS.Length;

    /// <summary>The median spacing of the samples, s.</summary>
    public double MedianPeriodS
    {
        get
        {
            if (TimeS.Length < 2)
            {
                return double.NaN;
            }

            var steps = new double[TimeS.Length - 1];
            for (int i = 1; i < TimeS.Length; i++)
            {
                steps[i - 1] = TimeS[i] - TimeS[i - 1];
            }

            Array.Sort(steps);
            return steps[steps.Length / 2];
        }
    }
}
