using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Tests;

public class CalibrateDistanceCommandTests
{
    /// <summary>A calibration roll as calibration.md §1 asks for it: the box configured 2 % long,
    /// a gentle roll to jogging pace, a long coast and a light stop on the rear brakes only, so the
    /// pickup's front wheel rolls freely; no tyre growth at speed. The truth's standstill
    /// distance plays the taped distance.</summary>
    internal static readonly Lazy<SimulationResult> Roll = new(() => Simulator.Run(RollScenario(), seed: 5));

    private static readonly Lazy<SimulationResult> RollAgain = new(() => Simulator.Run(RollScenario(), seed: 6));

    internal static Scenario RollScenario()
    {
        Scenario s = BuiltInScenarios.Default;
        return s with
        {
            Name = "calibration-roll",
            Tyre = s.Tyre with { RadiusGrowthAt30Mps = 0 },
            Brakes = s.Brakes with { FrontBias = 0 },
            Plan = new RunPlan { StageS = 3, TargetSpeedMps = 5, CoastS = 25, BrakeToStop = true, BrakeDemandG = 0.1, StandStillAfterS = 3 },
            Box = s.Box with { ConfiguredCircumferenceM = 2 * Math.PI * s.Tyre.RollingRadiusM * 1.02 },
        };
    }

    [Fact]
    public void TheCalibratedCircumferenceRecoversTheTrueOneWithinItsStatedUncertainty()
    {
        SimulationResult truth = Roll.Value;
        using var folder = new TempFolder();
        string log = Write(folder, "roll.log", truth.LogBytes);
        string settings = folder.File("car.json");
        double taped = truth.Events.StandstillDistanceM!.Value;
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateDistanceCommand.Run(
            new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = taped, TapeUncertaintyM = 0.001, Settings = new FileInfo(settings), Json = true },
            output,
            error);

        Assert.Equal(ExitCode.Ok, code);
        Assert.Equal("", error.ToString());
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement root = json.RootElement;
        double circumference = root.GetProperty("circumference_m").GetDouble();
        double sigma = root.GetProperty("circumference_sigma_m").GetDouble();

        // Common practice (measured roll, calibration.md §1) against the simulator's true rolling
        // circumference 2π·r; a 95 m roll counts about 2400 pulses, good to 1/√6 pulse.
        Assert.True(Math.Abs(circumference - truth.Sensors.TrueCircumferenceM) <= 3 * sigma, $"{circumference:F6} m ± {sigma:F6} against {truth.Sensors.TrueCircumferenceM:F6} m");
        Assert.InRange(sigma, 0.0002, 0.0006);
        Assert.Equal(truth.Sensors.Pulses, root.GetProperty("rolls")[0].GetProperty("pulses").GetInt64());

        // The box was configured 2 % long: the change is −1/1.02 − 1 ≈ −1.96 %.
        Assert.Equal((1 / 1.02 - 1) * 100, root.GetProperty("change_percent").GetDouble(), 1);
        Assert.Equal(truth.Sensors.ConfiguredCircumferenceM, root.GetProperty("configured_circumference_m").GetDouble(), 6);

        CalibrationSettings saved = CalibrationFile.Load(settings);
        Assert.Equal(circumference, saved.CircumferenceM!.Value, 6);
        Assert.Equal(sigma, saved.CircumferenceSigmaM!.Value, 6);
    }

    [Fact]
    public void TextOutputShowsTheChangeInPercentAndMillimetres()
    {
        SimulationResult truth = Roll.Value;
        using var folder = new TempFolder();
        string log = Write(folder, "roll.log", truth.LogBytes);
        var output = new StringWriter();

        ExitCode code = CalibrateDistanceCommand.Run(new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = 95 }, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        string text = output.ToString();
        Assert.Contains("rolling circumference", text, StringComparison.Ordinal);
        Assert.Matches(@"change [+-]\d+\.\d\d % \([+-]\d+\.\d mm\)", text);
        Assert.Contains("µm", text, StringComparison.Ordinal);
        Assert.Contains("Not saved", text, StringComparison.Ordinal);
    }

    [Fact]
    public void MergingKeepsTheOtherSettings()
    {
        using var folder = new TempFolder();
        string log = Write(folder, "roll.log", Roll.Value.LogBytes);
        string settings = folder.Write("car.json", "{ \"notes\": \"club roadster\", \"mounting_pitch_deg\": 1.25, \"circumference_m\": 1.5 }");

        ExitCode code = CalibrateDistanceCommand.Run(new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = 95, Settings = new FileInfo(settings) }, new StringWriter(), new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        CalibrationSettings saved = CalibrationFile.Load(settings);
        Assert.Equal("club roadster", saved.Notes);
        Assert.Equal(1.25, saved.MountingPitchDeg);
        Assert.NotEqual(1.5, saved.CircumferenceM);
        Assert.Single(Directory.GetFiles(folder.Path), f => f.EndsWith(".json", StringComparison.Ordinal));
    }

    [Fact]
    public void RepeatedRollsInOneLogAreChosenAndAveraged()
    {
        using var folder = new TempFolder();
        string log = Write(folder, "rolls.log", [.. Roll.Value.LogBytes, .. RollAgain.Value.LogBytes]);
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode unchosen = CalibrateDistanceCommand.Run(new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = 95 }, new StringWriter(), error);
        ExitCode chosen = CalibrateDistanceCommand.Run(new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = 95, Runs = ["1", "2"], Json = true }, output, new StringWriter());

        Assert.Equal(ExitCode.Usage, unchosen);
        Assert.Contains("holds 2 runs", error.ToString(), StringComparison.Ordinal);
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
        Assert.Equal(ExitCode.Ok, chosen);
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        Assert.Equal(2, json.RootElement.GetProperty("rolls").GetArrayLength());
        double mean = (Roll.Value.Sensors.Pulses + RollAgain.Value.Sensors.Pulses) / 2.0;
        Assert.Equal(mean, json.RootElement.GetProperty("mean_pulses").GetDouble(), 9);
    }

    [Fact]
    public void ABrokenSettingsFileStopsBeforeAnyWorkAndIsLeftAsItWas()
    {
        using var folder = new TempFolder();
        string log = Write(folder, "roll.log", Roll.Value.LogBytes);
        string settings = folder.Write("car.json", "{ \"circumference\": 1.96 }");
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateDistanceCommand.Run(new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = 95, Settings = new FileInfo(settings) }, output, error);

        Assert.Equal(ExitCode.BadInput, code);
        Assert.Equal("", output.ToString());
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
        Assert.Equal("{ \"circumference\": 1.96 }", File.ReadAllText(settings));
    }

    [Theory]
    [InlineData("no distance", 0.0, 0.05, null, ExitCode.Usage)]
    [InlineData("tape uncertainty larger than a tenth", 10.0, 2.0, null, ExitCode.Usage)]
    [InlineData("a run the log does not hold", 95.0, 0.05, "3", ExitCode.Usage)]
    [InlineData("not a run number", 95.0, 0.05, "first", ExitCode.Usage)]
    public void WrongRequestsGetOneLineAndAnExitCode(string name, double metres, double tape, string? run, ExitCode expected)
    {
        _ = name;
        using var folder = new TempFolder();
        string log = Write(folder, "roll.log", Roll.Value.LogBytes);
        var error = new StringWriter();

        ExitCode code = CalibrateDistanceCommand.Run(
            new CalibrateDistanceRequest { Log = new FileInfo(log), Metres = metres, TapeUncertaintyM = tape, Runs = run is null ? [] : [run] },
            new StringWriter(),
            error);

        Assert.Equal(expected, code);
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
        Assert.StartsWith("launchlogger calibrate distance: ", error.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void AMissingLogIsBadInput()
    {
        using var folder = new TempFolder();
        var error = new StringWriter();

        ExitCode code = CalibrateDistanceCommand.Run(new CalibrateDistanceRequest { Log = new FileInfo(folder.File("none.log")), Metres = 95 }, new StringWriter(), error);

        Assert.Equal(ExitCode.BadInput, code);
        Assert.Contains("file not found", error.ToString(), StringComparison.Ordinal);
    }

    internal static string Write(TempFolder folder, string name, byte[] bytes)
    {
        string path = folder.File(name);
        File.WriteAllBytes(path, bytes);
        return path;
    }
}
