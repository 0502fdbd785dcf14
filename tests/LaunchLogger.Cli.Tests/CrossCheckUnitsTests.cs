using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Cli.Tests;

/// <summary>crosscheck's table follows <c>--units</c> as report's does: before, its trap speeds
/// read in m/s whatever was asked (only the plot's axes followed the option).</summary>
public sealed partial class CrossCheckUnitsTests
{
    /// <summary>1 mph = 0.44704 m/s exactly (international yard and pound agreement, 1959).</summary>
    private const double MpsPerMph = 0.44704;

    /// <summary>1 km/h = 1000 m / 3600 s (SI, by definition of the prefix and the hour).</summary>
    private const double MpsPerKmh = 1000.0 / 3600.0;

    [Theory]
    [InlineData(DisplayUnits.Imperial, "mph", MpsPerMph)]
    [InlineData(DisplayUnits.Metric, "km/h", MpsPerKmh)]
    public void The_trap_speed_row_is_in_the_asked_unit(DisplayUnits units, string unitName, double mpsPerUnit)
    {
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        string nmea = folder.File("receiver.nmea");
        var sink = new StringWriter();
        Assert.Equal(ExitCode.Ok, SimulateCommand.Run("roadster-launch", 5, log, null, false, sink, sink, default, nmea, 10));

        var json = new StringWriter();
        ExitCode jsonCode = CrossCheckCommand.Run(new FileInfo(log), new FileInfo(nmea), "auto", null, "mps", "s", 0.05, 1, json: true, json, sink, default, null, units);
        Assert.True(jsonCode is ExitCode.Ok or ExitCode.Partial, $"exit {jsonCode}: {sink}");
        using JsonDocument document = JsonDocument.Parse(json.ToString());
        JsonElement trap = document.RootElement.GetProperty("figures").EnumerateArray().First(f => f.GetProperty("figure").GetString() == "1320 ft (1/4 mile) trap");
        Assert.Equal("m/s", trap.GetProperty("unit").GetString()); // the JSON stays SI

        var table = new StringWriter();
        CrossCheckCommand.Run(new FileInfo(log), new FileInfo(nmea), "auto", null, "mps", "s", 0.05, 1, json: false, table, sink, default, null, units);
        string row = table.ToString().Split('\n').Single(l => l.TrimStart().StartsWith("1320 ft (1/4 mile) trap", StringComparison.Ordinal));

        Assert.DoesNotContain("m/s", row, StringComparison.Ordinal);
        Match ours = SpeedWithSigma().Match(row);
        Assert.True(ours.Success && ours.Groups["unit"].Value == unitName, row);
        double shown = double.Parse(ours.Groups["value"].Value, CultureInfo.InvariantCulture);
        double sigma = double.Parse(ours.Groups["sigma"].Value, CultureInfo.InvariantCulture);
        Assert.Equal(trap.GetProperty("ours").GetDouble() / mpsPerUnit, shown, 0.006);
        Assert.Equal(trap.GetProperty("ours_sigma").GetDouble() / mpsPerUnit, sigma, 0.006);
    }

    [GeneratedRegex(@"(?<value>[0-9]+\.[0-9]+) ± (?<sigma>[0-9]+\.[0-9]+) (?<unit>mph|km/h)")]
    private static partial Regex SpeedWithSigma();
}
