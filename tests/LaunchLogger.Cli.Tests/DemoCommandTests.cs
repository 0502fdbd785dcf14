using System.Text.Json;
using LaunchLogger.Cli.Output;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Cli.Tests;

public class DemoCommandTests
{
    [Fact]
    public void DemoWritesTheLogTruthAndReportAndPrintsTheReport()
    {
        using var folder = new TempFolder();
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = DemoCommand.Run("roadster-launch", 1, folder.Path, DisplayUnits.Imperial, output, error);

        Assert.Equal(ExitCode.Ok, code);
        Assert.True(File.Exists(folder.File("roadster-launch.log")));
        Assert.True(File.Exists(folder.File("roadster-launch-truth.json")));
        Assert.True(File.Exists(folder.File("roadster-launch-report.txt")));
        ReportDocument? report = ReportJson.Deserialize(File.ReadAllText(folder.File("roadster-launch-report.json")));
        Assert.NotNull(report);
        Assert.NotEmpty(report!.Runs);
        Assert.Contains("0-60 mph", output.ToString());
        Assert.Contains("Against the simulator's truth", output.ToString());
        Assert.Empty(Directory.GetFiles(folder.Path, "*.part"));
    }

    /// <summary>The demo's comparison with the truth gives speeds and distances in --units, as
    /// the report above it does; before, it gave m/s and m whatever was asked, and its "in σ"
    /// column wrote '-' where the error column beside it writes '−'.</summary>
    [Theory]
    [InlineData(DisplayUnits.Imperial, "mph", "ft", 0.44704, 0.3048)] // exact (international yard and pound agreement, 1959)
    [InlineData(DisplayUnits.Metric, "km/h", "m", 1 / 3.6, 1.0)] // SI
    public void TheTruthComparisonFollowsTheUnitsAsked(DisplayUnits units, string speedUnit, string distanceUnit, double mpsPerSpeedUnit, double metresPerDistanceUnit)
    {
        using var folder = new TempFolder();
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, DemoCommand.Run("roadster-launch", 1, folder.Path, units, output, new StringWriter()));
        JsonElement truth = JsonDocument.Parse(File.ReadAllText(folder.File("roadster-launch-truth.json"))).RootElement;
        string[] comparison = output.ToString().Split('\n').SkipWhile(l => !l.StartsWith("Against the simulator's truth", StringComparison.Ordinal)).ToArray();

        double trueTrapMps = truth.GetProperty("figures").GetProperty("distance_marks").EnumerateArray()
            .Single(m => m.GetProperty("label").GetString() == "1320 ft (1/4 mile)").GetProperty("trap_speed_mps").GetDouble();
        Assert.Equal(trueTrapMps / mpsPerSpeedUnit, TruthColumn(comparison, "1320 ft (1/4 mile) trap speed", speedUnit), 0.002);
        double trueStopM = truth.GetProperty("events").GetProperty("stopping_distance_m").GetDouble();
        Assert.Equal(trueStopM / metresPerDistanceUnit, TruthColumn(comparison, "stopping distance", distanceUnit), 0.002);
        string[] rows = comparison.Skip(2).TakeWhile(l => l.StartsWith("  ", StringComparison.Ordinal) && !l.StartsWith("  (", StringComparison.Ordinal)).ToArray();
        Assert.True(rows.Length > 10, string.Join('\n', comparison));
        Assert.DoesNotContain(rows, l => l.Contains(" m/s", StringComparison.Ordinal));
        Assert.DoesNotContain(rows, l => System.Text.RegularExpressions.Regex.IsMatch(l, @"\s-\d"));
    }

    /// <summary>The truth column (the second number with its unit) of the comparison's row.</summary>
    private static double TruthColumn(string[] comparison, string label, string unit)
    {
        string row = comparison.Single(l => l.TrimStart().StartsWith(label + " ", StringComparison.Ordinal));
        var numbers = System.Text.RegularExpressions.Regex.Matches(row, @"([0-9]+\.[0-9]+) " + System.Text.RegularExpressions.Regex.Escape(unit) + @"(\s|$)");
        Assert.True(numbers.Count >= 2, row);
        return double.Parse(numbers[1].Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
    }

    [Fact]
    public void TheDemosJsonIsValidAndWithinItsStatedSigmaOfTheTruthItWrote()
    {
        using var folder = new TempFolder();
        Assert.Equal(ExitCode.Ok, DemoCommand.Run("roadster-launch", 1, folder.Path, DisplayUnits.Imperial, new StringWriter(), new StringWriter()));
        JsonElement report = JsonDocument.Parse(File.ReadAllText(folder.File("roadster-launch-report.json"))).RootElement;
        JsonElement truth = JsonDocument.Parse(File.ReadAllText(folder.File("roadster-launch-truth.json"))).RootElement;
        JsonElement run = report.GetProperty("runs")[0];
        JsonElement events = truth.GetProperty("events");

        // A clean run: valid, with no reasons.
        Assert.Equal("valid", run.GetProperty("verdict").GetProperty("level").GetString());
        Assert.Equal(0, run.GetProperty("verdict").GetProperty("reasons").GetArrayLength());

        // First motion and the rollout mark within 3σ of the truth, each σ as the report states it.
        AssertWithin(run.GetProperty("first_motion_s").GetDouble() - events.GetProperty("first_motion_s").GetDouble(), 3 * run.GetProperty("first_motion_uncertainty_s").GetDouble());
        JsonElement rollout = run.GetProperty("rollout");
        AssertWithin(rollout.GetProperty("time_s").GetDouble() - events.GetProperty("rollout_s").GetDouble(), 3 * rollout.GetProperty("time_uncertainty_s").GetDouble());

        // 0-60 mph against the truth's own figure: within 3σ plus the tyre's growth at speed as a
        // fraction of the time (the box counts turns of a static circumference).
        double growth = 0.004; // roadster-launch's tyre: 0.4 % at 30 m/s
        JsonElement ours = Interval(run, "0-60 mph");
        JsonElement real = Interval(truth.GetProperty("figures"), "0-60 mph");
        double t = ours.GetProperty("from_standstill_s").GetDouble();
        AssertWithin(t - real.GetProperty("from_standstill_s").GetDouble(), (3 * ours.GetProperty("uncertainty_s").GetDouble()) + (growth * t));
    }

    [Fact]
    public void AnUnknownScenarioIsAUsageErrorAndWritesNothing()
    {
        using var folder = new TempFolder();
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, DemoCommand.Run("no-such-car", 1, folder.Path, DisplayUnits.Imperial, new StringWriter(), error));
        Assert.Contains("unknown scenario", error.ToString());
        Assert.Empty(Directory.GetFiles(folder.Path));
    }

    private static JsonElement Interval(JsonElement figures, string label) =>
        figures.GetProperty("speed_intervals").EnumerateArray().Single(i => i.GetProperty("label").GetString() == label);

    private static void AssertWithin(double error, double tolerance) => Assert.InRange(error, -tolerance, tolerance);
}
