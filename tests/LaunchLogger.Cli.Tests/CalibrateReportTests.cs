using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Tests;

/// <summary><c>report --settings</c>: what the calibration verbs save is applied to every run.</summary>
public class CalibrateReportTests
{
    /// <summary>The demo roadster with the box configured 2 % long.</summary>
    private static readonly Lazy<SimulationResult> Miscalibrated = new(() =>
    {
        Scenario s = BuiltInScenarios.Default;
        return Simulator.Run(s with { Box = s.Box with { ConfiguredCircumferenceM = 2 * Math.PI * s.Tyre.RollingRadiusM * 1.02 } }, seed: 41);
    });

    [Fact]
    public void TheCalibratedCircumferenceBringsTheFiguresBackToTruth()
    {
        SimulationResult truth = Miscalibrated.Value;
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "launch.log", truth.LogBytes);
        string settings = folder.File("car.json");
        CalibrationFile.Save(settings, new CalibrationSettings { CircumferenceM = truth.Sensors.TrueCircumferenceM, MountingPitchDeg = 2.13, MountingPitchSigmaDeg = 0.01 });

        JsonElement plain = Report(new ReportRequest { Logs = [new FileInfo(log)], Json = true });
        JsonElement calibrated = Report(new ReportRequest { Logs = [new FileInfo(log)], Json = true, Settings = new FileInfo(settings) });

        // Distances scale with the circumference: 2 % long makes 60 mph come 2 % early in speed.
        double trueTime = truth.Figures!.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS!.Value;
        double plainError = Math.Abs(ZeroToSixty(plain) - trueTime);
        double calibratedError = Math.Abs(ZeroToSixty(calibrated) - trueTime);
        Assert.True(plainError > 0.05, $"the miscalibrated box is off by {plainError:F3} s");
        Assert.True(calibratedError < plainError / 3, $"calibrated off by {calibratedError:F3} s, uncalibrated {plainError:F3} s");

        JsonElement run = calibrated.GetProperty("runs")[0];
        Assert.Contains(run.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("rolling circumference", StringComparison.Ordinal));
        Assert.True(run.GetProperty("grade").GetProperty("mounting_calibrated").GetBoolean());
        Assert.False(plain.GetProperty("runs")[0].GetProperty("grade").GetProperty("mounting_calibrated").GetBoolean());
    }

    [Fact]
    public void AStaticCircumferenceToldAsSuchBringsTheFiguresCloserToTruth()
    {
        // The demo roadster (its tyre grows 0.4 % at 30 m/s) with the box told the tyre's static
        // circumference, on which it rolls 1.5 % less: told nothing, the report takes the static
        // figure as the rolling one; told it is static, it takes 1 % off and adds the typical growth.
        Scenario s = BuiltInScenarios.Default;
        double staticCircumference = 2 * Math.PI * s.Tyre.RollingRadiusM / 0.985;
        SimulationResult truth = Simulator.Run(s with { Box = s.Box with { ConfiguredCircumferenceM = staticCircumference } }, seed: 41);
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "launch.log", truth.LogBytes);
        string settings = folder.File("car.json");
        CalibrationFile.Save(settings, new CalibrationSettings { StaticCircumferenceM = Math.Round(staticCircumference, 6) });

        JsonElement plain = Report(new ReportRequest { Logs = [new FileInfo(log)], Json = true });
        JsonElement told = Report(new ReportRequest { Logs = [new FileInfo(log)], Json = true, Settings = new FileInfo(settings) });

        double trueTime = truth.Figures!.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS!.Value;
        double plainError = ZeroToSixty(plain) - trueTime;
        double toldError = ZeroToSixty(told) - trueTime;
        double toldSigma = ZeroToSixtyElement(told).GetProperty("uncertainty_s").GetDouble();
        Assert.True(Math.Abs(toldError) < Math.Abs(plainError) / 2, $"told static off by {toldError:F3} s, told nothing {plainError:F3} s");
        Assert.True(Math.Abs(toldError) <= 2 * toldSigma, $"told static off by {toldError:F3} s, σ {toldSigma:F3} s");
        Assert.Contains(told.GetProperty("runs")[0].GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("static circumference", StringComparison.Ordinal));
    }

    [Fact]
    public void AnUnusableSettingsFileIsOneLineAndBadInput()
    {
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "launch.log", SimulatedLogs.Default.LogBytes);
        string settings = folder.Write("car.json", "{ \"circumference_m\": \"big\" }");
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Settings = new FileInfo(settings) }, output, error);

        Assert.Equal(ExitCode.BadInput, code);
        Assert.Equal("", output.ToString());
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
        Assert.Contains("car.json", error.ToString(), StringComparison.Ordinal);
    }

    private static JsonElement Report(ReportRequest request)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        ExitCode code = ReportCommand.Run(request, output, error);
        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        return JsonDocument.Parse(output.ToString()).RootElement.Clone();
    }

    private static double ZeroToSixty(JsonElement report) => ZeroToSixtyElement(report).GetProperty("from_standstill_s").GetDouble();

    private static JsonElement ZeroToSixtyElement(JsonElement report) => report.GetProperty("runs")[0].GetProperty("speed_intervals").EnumerateArray()
        .Single(i => i.GetProperty("label").GetString() == "0-60 mph");
}
