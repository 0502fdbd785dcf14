using System.Globalization;
using System.Text.Json;

namespace LaunchLogger.Cli.Tests;

/// <summary>A stop too far from 60 mph or 100 km/h to be scaled to it says so in the reader's
/// units. Before, the table and the card printed the decoder's note, "not corrected: onset speed
/// 42.7 m/s is more than 10 % from 26.8 m/s", whatever --units said.</summary>
public sealed class StopCorrectionUnitsTests
{
    /// <summary>1 mph = 0.44704 m/s exactly (international yard and pound agreement, 1959); 1 km/h = 1/3.6 m/s (SI).</summary>
    private const double MpsPerMph = 0.44704, MpsPerKmh = 1 / 3.6;

    [Fact]
    public async Task The_table_and_the_card_give_the_onset_and_the_nominal_speed_in_the_asked_units()
    {
        using var folder = new TempFolder();
        string log = folder.File("quarter.log");
        File.WriteAllBytes(log, SimulatedLogs.Default.LogBytes);
        var json = new StringWriter();
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["report", log, "--json"], json, new StringWriter()));
        using JsonDocument document = JsonDocument.Parse(json.ToString());
        double fromMps = document.RootElement.GetProperty("runs")[0].GetProperty("braking").GetProperty("from_mps").GetDouble();
        Assert.True(fromMps > 1.1 * 100 * MpsPerKmh, $"the stop begins at {fromMps} m/s, within 10 % of a nominal speed");

        var imperial = new StringWriter();
        var metric = new StringWriter();
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["report", log], imperial, new StringWriter()));
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["report", log, "--units", "metric"], metric, new StringWriter()));
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["card", log, "--units", "metric", "--out", folder.File("card.html")], new StringWriter(), new StringWriter()));

        string mph = (fromMps / MpsPerMph).ToString("0.0", CultureInfo.InvariantCulture);
        string kmh = (fromMps / MpsPerKmh).ToString("0.0", CultureInfo.InvariantCulture);
        Assert.Contains($"not corrected: onset speed {mph} mph is more than 10 % from 60.0 mph", imperial.ToString(), StringComparison.Ordinal);
        Assert.Contains($"not corrected: onset speed {kmh} km/h is more than 10 % from 100.0 km/h", metric.ToString(), StringComparison.Ordinal);
        Assert.Contains($"not corrected: onset speed {kmh} km/h is more than 10 % from 100.0 km/h", File.ReadAllText(folder.File("card.html")), StringComparison.Ordinal);
        Assert.DoesNotContain(" m/s is more than", imperial.ToString() + metric, StringComparison.Ordinal);
    }
}
