namespace LaunchLogger.Cli.Bench;

/// <summary>How far an uncalibrated tyre is from what the box is told: the user gives the static
/// (unloaded) circumference, while the tyre rolls on a slightly smaller one under load and grows
/// with speed.</summary>
/// <remarks>The ranges are from memory, not from a document: a loaded radial tyre's effective
/// rolling circumference is about 0–2 % below its unloaded one, and it grows by a few tenths of a
/// percent at 30 m/s.</remarks>
public static class UncalibratedTyre
{
    /// <summary>Smallest rolling/static circumference ratio drawn.</summary>
    public const double LowestRollingOverStatic = 0.98;

    /// <summary>Largest growth at 30 m/s drawn (the smallest is 0.1 %).</summary>
    public const double HighestGrowthAt30Mps = 0.006;

    /// <summary>Draws a rolling/static ratio and a growth at 30 m/s.</summary>
    public static (double RollingOverStatic, double GrowthAt30Mps) Draw(Random random)
    {
        ArgumentNullException.ThrowIfNull(random);
        double ratio = LowestRollingOverStatic + (random.NextDouble() * (1 - LowestRollingOverStatic));
        double growth = 0.001 + (random.NextDouble() * (HighestGrowthAt30Mps - 0.001));
        return (ratio, growth);
    }
}
