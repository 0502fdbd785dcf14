using System.Globalization;
using LaunchLogger.Cli.Output;
using UnitsNet;

namespace LaunchLogger.Cli.Tests.Reference;

/// <summary>The report's own display conversions (m/s → mph and km/h, m → ft, m/s² → g) against
/// UnitsNet, a general-purpose units library used as the oracle. Large values make a factor
/// that is wrong in its sixth digit show through the display rounding.</summary>
public class DisplayConversionTests
{
    public static TheoryData<double> Values => [0.3048, 1.7289, 26.8224, 44.704, 402.336, 1234.5678, 98765.4321];

    [Theory]
    [MemberData(nameof(Values))]
    public void SpeedsInMphAndKmhAgreeWithUnitsNet(double mps)
    {
        // UnitsNet: Speed.FromMetersPerSecond(...).MilesPerHour / .KilometersPerHour.
        Assert.InRange(Number(Format.Speed(mps, DisplayUnits.Imperial), " mph") - Speed.FromMetersPerSecond(mps).MilesPerHour, -0.05, 0.05);
        Assert.InRange(Number(Format.Speed(mps, DisplayUnits.Metric), " km/h") - Speed.FromMetersPerSecond(mps).KilometersPerHour, -0.05, 0.05);
        Assert.InRange(Number(Format.SpeedSigma(mps, DisplayUnits.Imperial), "", "± ") - Speed.FromMetersPerSecond(mps).MilesPerHour, -0.005, 0.005);
        Assert.InRange(Number(Format.SpeedSigma(mps, DisplayUnits.Metric), "", "± ") - Speed.FromMetersPerSecond(mps).KilometersPerHour, -0.005, 0.005);
    }

    [Theory]
    [MemberData(nameof(Values))]
    public void DistancesInFeetAndMetresAgreeWithUnitsNet(double metres)
    {
        // UnitsNet: Length.FromMeters(...).Feet; metric distances print to the centimetre.
        Assert.InRange(Number(Format.Distance(metres, DisplayUnits.Imperial), " ft") - Length.FromMeters(metres).Feet, -0.05, 0.05);
        Assert.InRange(Number(Format.Distance(metres, DisplayUnits.Metric), " m") - metres, -0.005, 0.005);
    }

    [Theory]
    [MemberData(nameof(Values))]
    public void AccelerationsInGAgreeWithUnitsNet(double mps2)
    {
        // UnitsNet: Acceleration.FromMetersPerSecondSquared(...).StandardGravity (g0 = 9.80665 m/s²).
        string text = Format.Accel(mps2);
        int open = text.IndexOf('(', StringComparison.Ordinal);
        double g = Number(text[(open + 1)..], " g)");
        Assert.InRange(g - Acceleration.FromMetersPerSecondSquared(mps2).StandardGravity, -0.005, 0.005);
    }

    [Fact]
    public void MetricDistancesAllPrintToTheCentimetre()
    {
        Assert.Equal("402.34 m", Format.Distance(402.336, DisplayUnits.Metric));
        Assert.Equal("0.30 m", Format.Distance(0.3048, DisplayUnits.Metric));
        Assert.Equal("36.00 m", Format.Distance(36, DisplayUnits.Metric));
    }

    private static double Number(string text, string unit, string prefix = "")
    {
        Assert.StartsWith(prefix, text, StringComparison.Ordinal);
        Assert.EndsWith(unit, text, StringComparison.Ordinal);
        return double.Parse(text[prefix.Length..^unit.Length], NumberStyles.Float, CultureInfo.InvariantCulture);
    }
}
