using System.Globalization;
using System.Text.Json;
using LaunchLogger.Cli.Output;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

public class ReportCommandTests
{
    [Fact]
    public void JsonReportOfASimulatedLogHasTheDocumentedShape()
    {
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        File.WriteAllBytes(log, SimulatedLogs.Default.LogBytes);
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true }, output, error);

        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement root = json.RootElement;
        Assert.Equal("launchlogger-report", root.GetProperty("format").GetString());
        JsonElement run = root.GetProperty("runs")[0];
        Assert.Equal(JsonValueKind.Number, run.GetProperty("first_motion_s").ValueKind);
        Assert.True(run.GetProperty("first_motion_uncertainty_s").GetDouble() > 0);
        JsonElement rollout = run.GetProperty("rollout");
        Assert.Equal(0.3048, rollout.GetProperty("distance_m").GetDouble(), 9);
        Assert.Equal(JsonValueKind.Number, rollout.GetProperty("time_s").ValueKind);
        Assert.Equal(JsonValueKind.Number, rollout.GetProperty("speed_mps").ValueKind);

        JsonElement zeroTo60 = run.GetProperty("speed_intervals").EnumerateArray().Single(i => i.GetProperty("label").GetString() == "0-60 mph");
        Assert.Equal(26.8224, zeroTo60.GetProperty("to_mps").GetDouble(), 9);
        double standstill = zeroTo60.GetProperty("from_standstill_s").GetDouble();
        double fromRollout = zeroTo60.GetProperty("from_rollout_s").GetDouble();
        Assert.True(fromRollout < standstill, "the rollout convention must give the shorter time");
        Assert.Equal(standstill - fromRollout, rollout.GetProperty("after_first_motion_s").GetDouble(), 6);
        Assert.True(zeroTo60.GetProperty("uncertainty_s").GetDouble() > 0);

        JsonElement[] marks = run.GetProperty("distance_marks").EnumerateArray().ToArray();
        JsonElement sixty = marks.Single(m => m.GetProperty("label").GetString() == "60 ft");
        Assert.Equal(JsonValueKind.Null, sixty.GetProperty("trap_speed_mps").ValueKind);
        Assert.Equal(18.288, sixty.GetProperty("distance_m").GetDouble(), 9);
        Assert.Equal(JsonValueKind.Array, run.GetProperty("warnings").ValueKind);
    }

    [Fact]
    public void TablesShowBothConventionsSideBySide()
    {
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        File.WriteAllBytes(log, SimulatedLogs.Default.LogBytes);
        var output = new StringWriter();

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Units = DisplayUnits.Metric }, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        string text = output.ToString();
        Assert.Contains("From standstill", text);
        Assert.Contains("After rollout", text);
        Assert.Contains("0-100 km/h", text);
        Assert.Contains("km/h", text);
    }

    [Fact]
    public void EdgesAndAccelerometerCsvOfAConstantAccelerationGiveTheClosedForm()
    {
        // Kinematics (any textbook): from rest at a, the edge of pulse n comes at t0 + sqrt(2·n·dp/a);
        // the 0.5 g case of shared REFERENCES.md: 0–60 mph in 5.4702 s, 5.1177 s after 1 ft.
        const double G0 = 9.80665;
        const double A = 0.5 * G0;
        const double T0 = 2.0;
        const double MetresPerPulse = 0.02;
        using var folder = new TempFolder();
        var edges = new List<string> { "t_s" };
        // An undriven wheel, spun up only by its tyre, turns less than the road by s = I·a/(r²·N·C)
        // (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; I 1.2 kg·m², r 0.30 m, N 4.0 kN,
        // C 20, a road car's, from memory): pulse n comes when the car has covered n·dp/(1 − s).
        double lag = 1.2 * A / (0.30 * 0.30 * 4000 * 20);
        for (int n = 1; n * MetresPerPulse < 200; n++)
        {
            edges.Add((T0 + Math.Sqrt(2 * n * MetresPerPulse / ((1 - lag) * A))).ToString("R", CultureInfo.InvariantCulture));
        }

        var accel = new List<string> { "t_s,ax_mps2" };
        for (int i = 0; i < 12_000; i++)
        {
            double t = i * 0.001;
            accel.Add(string.Create(CultureInfo.InvariantCulture, $"{t:R},{(t >= T0 ? A : 0):R}"));
        }

        string edgesFile = folder.Write("edges.csv", string.Join('\n', edges) + "\n");
        string accelFile = folder.Write("accel.csv", string.Join('\n', accel) + "\n");
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = ReportCommand.Run(
            new ReportRequest { Edges = new FileInfo(edgesFile), Accel = new FileInfo(accelFile), MetresPerPulse = MetresPerPulse, Json = true },
            output,
            error);

        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement run = json.RootElement.GetProperty("runs")[0];
        // The method's own error on this input is about 0.4 ms from standstill and under 0.05 ms
        // after rollout (measured); the tolerances are a few times that, not a rounding.
        Assert.InRange(run.GetProperty("first_motion_s").GetDouble() - T0, -0.0015, 0.0015);
        JsonElement zeroTo60 = run.GetProperty("speed_intervals").EnumerateArray().Single(i => i.GetProperty("label").GetString() == "0-60 mph");
        Assert.InRange(zeroTo60.GetProperty("from_standstill_s").GetDouble() - 5.4702, -0.0015, 0.0015);
        // After rollout the wheel's untold slip is what is left: 1σ of its prior (0.54·10⁻⁴ s²/m,
        // UndrivenSlipPerMps2) is 1.45 ms at 60 mph.
        Assert.InRange(zeroTo60.GetProperty("from_rollout_s").GetDouble() - 5.1177, -0.0015, 0.0015);
    }

    /// <summary>A plain-text table given where a log goes: before, three lines of a damaged log
    /// ("no readable frames", "the log ends inside a frame", "no runs in the input"); now one line
    /// that says what it is and which option reads it.</summary>
    [Fact]
    public void A_csv_given_as_a_log_says_which_option_reads_it()
    {
        using var folder = new TempFolder();
        string csv = folder.Write("accel.csv", "t_s,ax_mps2\n0,0.1\n0.01,4.9\n");
        var error = new StringWriter();

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(csv)] }, new StringWriter(), error);

        Assert.Equal(ExitCode.Usage, code);
        string message = error.ToString().Trim();
        Assert.DoesNotContain("\n", message);
        Assert.Contains("accel.csv is a plain-text table, not a log from the box: give it with --edges", message, StringComparison.Ordinal);
        Assert.Contains("--accel", message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("missing.log", "missing.log")]
    public void AMissingLogIsOneClearLine(string name, string expected)
    {
        using var folder = new TempFolder();
        var error = new StringWriter();
        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(folder.File(name))] }, new StringWriter(), error);
        Assert.Equal(ExitCode.BadInput, code);
        string message = error.ToString().Trim();
        Assert.Contains(expected, message);
        Assert.DoesNotContain("\n", message);
        Assert.DoesNotContain("   at ", message);
    }

    [Theory]
    [InlineData("time_s\n1.0\n", "t_s")]
    [InlineData("t_s\n1.0\n1.1\nabc\n1.3\n", "edges.csv:4: column 't_s': 'abc' is not a number")]
    [InlineData("t_s\n1.0\n1.2\n1.1\n1.3\n", "edges.csv:4: time goes backwards")]
    public void BadEdgeFilesNameTheFileAndLine(string content, string expected)
    {
        using var folder = new TempFolder();
        string path = folder.Write("edges.csv", content);
        var error = new StringWriter();
        ExitCode code = ReportCommand.Run(new ReportRequest { Edges = new FileInfo(path), MetresPerPulse = 0.04 }, new StringWriter(), error);
        Assert.Equal(ExitCode.BadInput, code);
        string message = error.ToString().Trim();
        Assert.Contains("edges.csv", message);
        Assert.Contains(expected, message);
        Assert.DoesNotContain("   at ", message);
    }

    [Fact]
    public void PlainTextPulsesNeedAScale()
    {
        using var folder = new TempFolder();
        string path = folder.Write("edges.csv", "t_s\n1.0\n1.1\n1.2\n");
        var error = new StringWriter();
        ExitCode code = ReportCommand.Run(new ReportRequest { Edges = new FileInfo(path) }, new StringWriter(), error);
        Assert.Equal(ExitCode.BadInput, code);
        Assert.Contains("--metres-per-pulse", error.ToString());
    }

    [Fact]
    public void NothingToReadIsAUsageError()
    {
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, ReportCommand.Run(new ReportRequest(), new StringWriter(), error));
        Assert.Contains("nothing to read", error.ToString());
    }

    [Fact]
    public void ABadIntervalIsAUsageError()
    {
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, ReportCommand.Run(new ReportRequest { Intervals = ["40-80"] }, new StringWriter(), error));
        Assert.Contains("needs a unit", error.ToString());
    }

    [Fact]
    public void ExtraIntervalsAreReported()
    {
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        File.WriteAllBytes(log, SimulatedLogs.Default.LogBytes);
        var output = new StringWriter();
        ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true, Intervals = ["10-40mph"] }, output, new StringWriter());
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        Assert.Contains(json.RootElement.GetProperty("runs")[0].GetProperty("speed_intervals").EnumerateArray(), i => i.GetProperty("label").GetString() == "10-40 mph");
    }
}
