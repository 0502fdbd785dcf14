using System.Text.Json;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

public sealed class CrossCheckCommandTests
{
    [Fact]
    public void A_simulated_log_and_its_receiver_record_agree_within_the_combined_uncertainty()
    {
        string folder = Directory.CreateTempSubdirectory("crosscheck").FullName;
        string log = Path.Combine(folder, "run.log");
        string nmea = Path.Combine(folder, "receiver.nmea");
        var sink = new StringWriter();
        Assert.Equal(ExitCode.Ok, SimulateCommand.Run("brake-test-60", 4, log, null, false, sink, sink, default, nmea, 10));

        var output = new StringWriter();
        var error = new StringWriter();
        ExitCode code = CrossCheckCommand.Run(new FileInfo(log), new FileInfo(nmea), "auto", null, "mps", "s", 0.05, 1, json: true, output, error);
        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        using JsonDocument document = JsonDocument.Parse(output.ToString());
        JsonElement root = document.RootElement;

        // The receiver's clock reads the box's plus 43,000.0371 s (SatelliteReceiver's default).
        Assert.InRange(root.GetProperty("clock_offset_s").GetDouble(), -43_000.0371 - 0.005, -43_000.0371 + 0.005);
        Assert.Equal(10, root.GetProperty("sample_rate_hz").GetDouble(), 6);
        Assert.True(root.GetProperty("figures").GetArrayLength() > 0);
    }

    [Fact]
    public void Csv_without_a_column_map_is_a_usage_error()
    {
        string folder = Directory.CreateTempSubdirectory("crosscheck").FullName;
        string csv = Path.Combine(folder, "other.csv");
        File.WriteAllText(csv, "t,v\n0,0\n");
        var error = new StringWriter();
        ExitCode code = CrossCheckCommand.Run(new FileInfo(Path.Combine(folder, "run.log")), new FileInfo(csv), "auto", null, "mps", "s", 0.1, 1, false, new StringWriter(), error);
        Assert.Equal(ExitCode.Usage, code);
        Assert.Contains("--columns is needed", error.ToString(), StringComparison.Ordinal);
    }
}
