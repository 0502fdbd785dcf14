using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Tests;

public class CalibrateTeethCommandTests
{
    /// <summary>A steady cruise as calibration.md §4 asks for it: exact edge times, up to 8 m/s and
    /// a long coast on a 48-tooth ring whose edges are off by 1 % of a pitch (1 σ), the box's
    /// counter starting at an odd value so the tooth numbering is tested too.</summary>
    private static readonly Lazy<SimulationResult> Cruise = new(() =>
    {
        Scenario s = BuiltInScenarios.Get("electric-saloon");
        return Simulator.Run(
            s with
            {
                Name = "cruise",
                Pickup = s.Pickup with { Teeth = 48, ToothSpacingErrorFraction = 0.01 },
                Plan = new RunPlan { StageS = 3, TargetSpeedMps = 8, CoastS = 40, BrakeToStop = true, BrakeDemandG = 0.2, StandStillAfterS = 3 },
                Box = s.Box with { CounterStart = 1_000_003 },
            },
            seed: 31);
    });

    [Fact]
    public void TheMapRecoversTheSimulatedToothSpacing()
    {
        SimulationResult truth = Cruise.Value;
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "cruise.log", truth.LogBytes);
        string settings = folder.File("car.json");
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateTeethCommand.Run(new CalibrateTeethRequest { Log = new FileInfo(log), Settings = new FileInfo(settings), Json = true }, output, error);

        Assert.Equal(ExitCode.Ok, code);
        Assert.Equal("", error.ToString());
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement root = json.RootElement;
        double[] spacing = root.GetProperty("spacing").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        double[] sigma = root.GetProperty("sigma").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        Assert.Equal("hardware_count_mod_pulses_per_revolution", root.GetProperty("tooth_index").GetString());
        Assert.True(root.GetProperty("revolutions").GetDouble() >= 100);

        // The report applies a saved map only to runs whose steady revolutions fix its turn: the
        // JSON says so rather than promising it for every run.
        Assert.Equal("per_run_when_its_steady_revolutions_fix_the_turn", root.GetProperty("applied_by_report").GetString());
        Assert.Equal(ToothSpacingCalibration.MinimumAlignmentRevolutions, root.GetProperty("alignment_revolutions_per_tooth").GetInt32());

        // Truth: gap k ends at the edge counted when the hardware counter reaches a value ≡ k
        // (mod n); the simulator's first counted edge has count counter_start + 1.
        IReadOnlyList<double> edges = truth.Sensors.EdgePositionsRev;
        int n = edges.Count;
        long start = truth.Scenario.Box.CounterStart;
        double worst = 0;
        for (int k = 0; k < n; k++)
        {
            int j = (int)((((k - start - 1) % n) + n) % n);
            double gap = edges[j] - edges[(j - 1 + n) % n];
            double trueGap = (gap < 0 ? gap + 1 : gap) * n;
            Assert.True(Math.Abs(spacing[k] - trueGap) <= 5 * sigma[k], $"tooth {k}: {spacing[k]:F6} ± {sigma[k]:E1} against {trueGap:F6}");
            worst = Math.Max(worst, Math.Abs(spacing[k] - trueGap));
        }

        Assert.True(worst < 5e-4, $"worst tooth off by {worst:P3}");
        Assert.True(root.GetProperty("rms_deviation").GetDouble() > 0.005, "a 1 % ring must show");

        CalibrationSettings saved = CalibrationFile.Load(settings);
        Assert.Equal(n, saved.ToothSpacing!.Count);
        Assert.Equal(spacing[5], saved.ToothSpacing[5], 6);
    }

    [Fact]
    public void TextOutputListsEveryToothAndSaysHowTheReportUsesTheMap()
    {
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "cruise.log", Cruise.Value.LogBytes);
        var output = new StringWriter();

        ExitCode code = CalibrateTeethCommand.Run(new CalibrateTeethRequest { Log = new FileInfo(log) }, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        string text = output.ToString();
        Assert.Contains(" 47 ", text, StringComparison.Ordinal);
        Assert.Contains("hardware count mod 48", text, StringComparison.Ordinal);
        Assert.Contains("`report --settings` places each edge by it", text, StringComparison.Ordinal);
    }

    [Fact]
    public void APolledLaunchIsNoCruise()
    {
        // The demo roadster: a 200 µs polled counter and a hard launch to 100 mph.
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "launch.log", SimulatedLogs.Default.LogBytes);
        var error = new StringWriter();

        ExitCode code = CalibrateTeethCommand.Run(new CalibrateTeethRequest { Log = new FileInfo(log) }, new StringWriter(), error);

        Assert.Equal(ExitCode.BadInput, code);
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
        Assert.Contains("launchlogger calibrate teeth: ", error.ToString(), StringComparison.Ordinal);
    }
}
