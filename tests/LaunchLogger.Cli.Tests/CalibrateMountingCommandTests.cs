using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Cli.Tests;

public class CalibrateMountingCommandTests
{
    private const double GradePercent = 2.0;

    private static readonly Lazy<SimulationResult> Level = new(() => Simulator.Run(BuiltInScenarios.Default, seed: 21));

    private static readonly Lazy<SimulationResult> FacingUphill = new(() => Simulator.Run(OnSlope(GradePercent), seed: 22));

    private static readonly Lazy<SimulationResult> FacingDownhill = new(() => Simulator.Run(OnSlope(-GradePercent), seed: 23));

    /// <summary>The default roadster on one spot of a slope: facing the other way, the slope
    /// along the car changes sign and the mounting does not.</summary>
    private static Scenario OnSlope(double gradePercent) =>
        BuiltInScenarios.Default with { Environment = BuiltInScenarios.Default.Environment with { GradePercent = gradePercent } };

    /// <summary>What the simulated accelerometer reads at rest, and how a forward acceleration
    /// changes its readings, from the simulator's documented sensor model (AccelerometerModel:
    /// the sensor's axes in body coordinates are the columns of R = Rz(ψ)·Ry(−β)·Rx(ρ); readings
    /// are (1 + scale error)·Rᵀ·f + offset). The body leans on its suspension on a slope by
    /// m·g·sin θ·h/k (the vehicle model's static pitch; Gillespie, ch. 2).</summary>
    private static (double RestPitchRad, double YawRad) Expected(Scenario scenario)
    {
        const double G0 = 9.80665;
        AccelerometerSpec a = scenario.Accelerometer;
        VehicleSpec v = scenario.Vehicle;
        double theta = Math.Atan(scenario.Environment.GradePercent / 100);
        double lean = v.MassKg * G0 * Math.Sin(theta) * v.CgHeightM / v.PitchStiffnessNmPerRad;
        double tilt = theta + lean;
        double[,] r = AccelerometerModel.MountRotation(a.MountYawDeg, a.MountPitchDeg, a.MountRollDeg);
        double[] scale = [1 + a.ScaleError.X, 1 + a.ScaleError.Y, 1 + a.ScaleError.Z];
        double[] bias = [a.BiasMilliG.X, a.BiasMilliG.Y, a.BiasMilliG.Z];
        var reading = new double[3];
        for (int axis = 0; axis < 3; axis++)
        {
            reading[axis] = (scale[axis] * 1000 * ((r[0, axis] * Math.Sin(tilt)) + (r[2, axis] * Math.Cos(tilt)))) + bias[axis];
        }

        double magnitude = Math.Sqrt((reading[0] * reading[0]) + (reading[1] * reading[1]) + (reading[2] * reading[2]));
        double pitch = Math.Asin(reading[0] / magnitude);

        // A forward acceleration a changes x by scale·R00·a and y (left) by scale·R01·a.
        double yaw = -Math.Atan2(scale[1] * r[0, 1], scale[0] * r[0, 0]);
        return (pitch, yaw);
    }

    private static double Deg(double rad) => rad * 180 / Math.PI;

    [Fact]
    public void OnLevelGroundPitchWithTheOffsetAndYawAreRecovered()
    {
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "level.log", Level.Value.LogBytes);
        string settings = folder.File("car.json");
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateMountingCommand.Run(new CalibrateMountingRequest { Logs = [new FileInfo(log)], Settings = new FileInfo(settings), Json = true }, output, error);

        Assert.Equal(ExitCode.Ok, code);
        Assert.Contains("ASSUMES LEVEL GROUND", error.ToString(), StringComparison.Ordinal);
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement root = json.RootElement;
        (double pitch, double yaw) = Expected(BuiltInScenarios.Default);

        // The scenario mounts the box 1.5° nose up with a 12 milli-g forward offset: about 2.13°
        // of resting pitch on level ground.
        double pitchDeg = root.GetProperty("pitch_deg").GetDouble();
        double pitchSigma = root.GetProperty("pitch_sigma_deg").GetDouble();
        Assert.True(Math.Abs(pitchDeg - Deg(pitch)) <= 4 * pitchSigma, $"pitch {pitchDeg:F4}° ± {pitchSigma:F4}° against {Deg(pitch):F4}°");
        Assert.InRange(pitchSigma, 0.002, 0.02);
        double yawDeg = root.GetProperty("yaw_deg").GetDouble();
        double yawSigma = root.GetProperty("yaw_sigma_deg").GetDouble();
        Assert.True(Math.Abs(yawDeg - Deg(yaw)) <= 3 * yawSigma, $"yaw {yawDeg:F4}° ± {yawSigma:F4}° against {Deg(yaw):F4}°");
        Assert.InRange(yawSigma, 0.005, 0.1);
        Assert.True(root.GetProperty("level_ground_assumed").GetBoolean());

        CalibrationSettings saved = CalibrationFile.Load(settings);
        Assert.Equal(pitchDeg, saved.MountingPitchDeg!.Value, 4);
        Assert.Equal(yawDeg, saved.MountingYawDeg!.Value, 4);
        Assert.Equal(Math.PI / 180 * saved.MountingPitchDeg.Value, saved.MountingPitchRad!.Value, 12);
    }

    [Fact]
    public void TwoOppositeRestsSeparateTheMountingFromTheSlopeAndTellTheGrade()
    {
        using var folder = new TempFolder();
        string a = CalibrateDistanceCommandTests.Write(folder, "a.log", FacingUphill.Value.LogBytes);
        string b = CalibrateDistanceCommandTests.Write(folder, "b.log", FacingDownhill.Value.LogBytes);
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateMountingCommand.Run(new CalibrateMountingRequest { Logs = [new FileInfo(a), new FileInfo(b)], Json = true }, output, error);

        Assert.Equal(ExitCode.Ok, code);
        Assert.Equal("", error.ToString());
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement root = json.RootElement;
        double restA = Expected(OnSlope(GradePercent)).RestPitchRad;
        double restB = Expected(OnSlope(-GradePercent)).RestPitchRad;
        double level = Expected(BuiltInScenarios.Default).RestPitchRad;

        // calibration.md §3: mounting = mean of the two rests, slope = half their difference.
        double pitchDeg = root.GetProperty("pitch_deg").GetDouble();
        double sigma = root.GetProperty("pitch_sigma_deg").GetDouble();
        Assert.True(Math.Abs(pitchDeg - Deg((restA + restB) / 2)) <= 4 * sigma, $"mounting {pitchDeg:F4}° ± {sigma:F4}°");
        Assert.True(Math.Abs(pitchDeg - Deg(level)) <= (4 * sigma) + 0.002, $"mounting {pitchDeg:F4}° against {Deg(level):F4}° on level ground");
        double gradeDeg = root.GetProperty("grade_deg").GetDouble();
        Assert.True(Math.Abs(gradeDeg - Deg((restA - restB) / 2)) <= 4 * root.GetProperty("grade_sigma_deg").GetDouble(), $"slope {gradeDeg:F4}°");

        // The slope itself, 2 %, within what the sensor's scale and offsets make of it (a few %).
        Assert.InRange(root.GetProperty("grade_percent").GetDouble(), 0.95 * GradePercent, 1.05 * GradePercent);
        Assert.False(root.GetProperty("level_ground_assumed").GetBoolean());
        Assert.Equal(2, root.GetProperty("yaws").GetArrayLength());
    }

    [Fact]
    public void TextOutputTellsTheGradeOfTheSpot()
    {
        using var folder = new TempFolder();
        string both = CalibrateDistanceCommandTests.Write(folder, "both.log", [.. FacingUphill.Value.LogBytes, .. FacingDownhill.Value.LogBytes]);
        var output = new StringWriter();

        ExitCode code = CalibrateMountingCommand.Run(new CalibrateMountingRequest { Logs = [new FileInfo(both)], Runs = ["1", "2"] }, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        string text = output.ToString();
        Assert.Matches(@"the spot slopes \+[12]\.\d\d % ± 0\.\d\d %", text);
        Assert.Contains("uphill in the direction rest A faced", text, StringComparison.Ordinal);
        Assert.DoesNotContain("ASSUMES LEVEL GROUND", text, StringComparison.Ordinal);
    }

    [Fact]
    public void TheLevelGroundAssumptionIsLoudInHelpAndOutput()
    {
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "level.log", Level.Value.LogBytes);
        var output = new StringWriter();

        CalibrateMountingCommand.Run(new CalibrateMountingRequest { Logs = [new FileInfo(log)] }, output, new StringWriter());

        Assert.StartsWith("ASSUMES LEVEL GROUND", output.ToString(), StringComparison.Ordinal);
        Command verb = CalibrateMountingCommand.Create();
        Assert.Contains("LEVEL", verb.Description, StringComparison.Ordinal);
        Assert.Contains("LEVEL GROUND", verb.Arguments.Single().Description, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("two logs, one run", 2, new[] { "1" })]
    [InlineData("three runs", 1, new[] { "1", "1", "1" })]
    [InlineData("a range", 1, new[] { "1-2" })]
    public void WrongCombinationsAreUsageErrors(string name, int logs, string[] runs)
    {
        _ = name;
        using var folder = new TempFolder();
        string log = CalibrateDistanceCommandTests.Write(folder, "level.log", Level.Value.LogBytes);
        var error = new StringWriter();

        ExitCode code = CalibrateMountingCommand.Run(
            new CalibrateMountingRequest { Logs = Enumerable.Repeat(new FileInfo(log), logs).ToList(), Runs = runs },
            new StringWriter(),
            error);

        Assert.Equal(ExitCode.Usage, code);
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
    }
}
