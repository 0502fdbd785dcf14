using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using UnitsNet;

namespace LaunchLogger.Decoding.Tests.Calibration;

public sealed class CalibrationFileTests : IDisposable
{
    private readonly string folder = Path.Combine(Path.GetTempPath(), "launchlogger-calibration-" + Guid.NewGuid().ToString("N"));

    public CalibrationFileTests() => Directory.CreateDirectory(folder);

    public void Dispose() => Directory.Delete(folder, recursive: true);

    private static CalibrationSettings Full() => new()
    {
        Notes = "club roadster, 2.1 bar",
        CircumferenceM = 1.959984,
        CircumferenceSigmaM = 0.00098,
        MountingPitchDeg = 2.134,
        MountingPitchSigmaDeg = 0.005,
        MountingYawDeg = 1.96,
        MountingYawSigmaDeg = 0.04,
        ToothSpacing = [1.01, 0.99, 1.02, 0.98],
        ToothSpacingSigma = [0.0001, 0.0001, 0.0002, 0.0001],
        BrakeSwitchDelayS = 0.012,
        BrakeSwitchDelaySigmaS = 0.0015,
        PickupWheel = Decoding.Reconstruction.PickupWheel.Driven,
    };

    [Fact]
    public void SavedSettingsLoadBackTheSame()
    {
        string path = Path.Combine(folder, "car.json");

        CalibrationFile.Save(path, Full());
        CalibrationSettings loaded = CalibrationFile.Load(path);

        Assert.Equal(Full() with { ToothSpacing = null, ToothSpacingSigma = null }, loaded with { ToothSpacing = null, ToothSpacingSigma = null });
        Assert.Equal(Full().ToothSpacing, loaded.ToothSpacing);
        Assert.Equal(Full().ToothSpacingSigma, loaded.ToothSpacingSigma);
        Assert.Equal([path], Directory.GetFiles(folder));
    }

    [Fact]
    public void TheFileUsesSnakeCaseNamesAndLeavesOutWhatIsNotSet()
    {
        string json = CalibrationFile.ToJson(new CalibrationSettings { CircumferenceM = 1.96 });

        Assert.Contains("\"circumference_m\": 1.96", json, StringComparison.Ordinal);
        Assert.Contains("\"version\": 1", json, StringComparison.Ordinal);
        Assert.DoesNotContain("mounting", json, StringComparison.Ordinal);
        Assert.DoesNotContain("rad", json, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("driven", Decoding.Reconstruction.PickupWheel.Driven)]
    [InlineData("undriven", Decoding.Reconstruction.PickupWheel.Undriven)]
    [InlineData("driven_all_wheels", Decoding.Reconstruction.PickupWheel.DrivenAllWheels)]
    public void ThePickupWheelIsOneOfThreeWords(string word, Decoding.Reconstruction.PickupWheel wheel)
    {
        string path = Path.Combine(folder, "wheel.json");
        File.WriteAllText(path, $"{{ \"pickup_wheel\": \"{word}\" }}");

        Assert.Equal(wheel, CalibrationFile.Load(path).PickupWheel);
        Assert.Contains($"\"pickup_wheel\": \"{word}\"", CalibrationFile.ToJson(new CalibrationSettings { PickupWheel = wheel }), StringComparison.Ordinal);
        Assert.DoesNotContain("pickup_wheel", CalibrationFile.ToJson(new CalibrationSettings()), StringComparison.Ordinal);
    }

    [Fact]
    public void AnglesAreOfferedInRadiansForTheGradeEstimate()
    {
        CalibrationSettings s = Full();

        // UnitsNet as the conversion oracle.
        Assert.Equal(Angle.FromDegrees(2.134).Radians, s.MountingPitchRad!.Value, 14);
        Assert.Equal(Angle.FromDegrees(0.005).Radians, s.MountingPitchSigmaRad!.Value, 14);
        Assert.Equal(Angle.FromDegrees(1.96).Radians, s.MountingYawRad!.Value, 14);
        Assert.Null(new CalibrationSettings().MountingPitchRad);
    }

    [Theory]
    [InlineData("unknown field", "{ \"version\": 1, \"wheel_size\": 17 }", "wheel_size")]
    [InlineData("not JSON", "circumference = 1.96", "not a settings file")]
    [InlineData("circumference out of range", "{ \"circumference_m\": 19.6 }", "circumference_m")]
    [InlineData("static circumference out of range", "{ \"static_circumference_m\": 0.05 }", "static_circumference_m")]
    [InlineData("newer version", "{ \"version\": 2 }", "version 2")]
    [InlineData("tooth map not averaging one", "{ \"tooth_spacing\": [1.1, 1.1, 1.1] }", "average 1")]
    [InlineData("sigmas not matching the map", "{ \"tooth_spacing\": [1.0, 1.0], \"tooth_spacing_sigma\": [0.1] }", "as many entries")]
    [InlineData("mounting pitch out of range", "{ \"mounting_pitch_deg\": 60 }", "mounting_pitch_deg")]
    [InlineData("switch delay negative", "{ \"brake_switch_delay_s\": -0.01 }", "brake_switch_delay_s")]
    [InlineData("switch delay in ms by mistake", "{ \"brake_switch_delay_s\": 12 }", "brake_switch_delay_s")]
    [InlineData("switch delay's σ alone", "{ \"brake_switch_delay_sigma_s\": 0.001 }", "without brake_switch_delay_s")]
    [InlineData("pickup wheel not one of the two", "{ \"pickup_wheel\": \"rear\" }", "not a settings file")]
    [InlineData("pickup wheel as a number", "{ \"pickup_wheel\": 1 }", "not a settings file")]
    [InlineData("pickup wheel written as not said", "{ \"pickup_wheel\": \"not_said\" }", "pickup_wheel must be driven, driven_all_wheels or undriven")]
    [InlineData("switch delay's σ zero", "{ \"brake_switch_delay_s\": 0.01, \"brake_switch_delay_sigma_s\": 0 }", "brake_switch_delay_sigma_s")]
    public void UnusableFilesAreRefusedInOneLine(string name, string text, string expected)
    {
        _ = name;
        string path = Path.Combine(folder, "bad.json");
        File.WriteAllText(path, text);

        var e = Assert.Throws<InputException>(() => CalibrationFile.Load(path));

        Assert.Contains(expected, e.Message, StringComparison.Ordinal);
        Assert.DoesNotContain('\n', e.Message);
    }

    [Fact]
    public void AMissingFileIsEmptySettingsForTheCalibrationVerbsButAnErrorForLoad()
    {
        string path = Path.Combine(folder, "none.json");

        Assert.Equal(new CalibrationSettings(), CalibrationFile.LoadOrEmpty(path));
        Assert.Throws<InputException>(() => CalibrationFile.Load(path));
    }

    [Fact]
    public void InvalidSettingsAreNeverWrittenAndTheOldFileStays()
    {
        string path = Path.Combine(folder, "car.json");
        CalibrationFile.Save(path, Full());
        string before = File.ReadAllText(path);

        Assert.Throws<ArgumentException>(() => CalibrationFile.Save(path, Full() with { CircumferenceM = -1 }));

        Assert.Equal(before, File.ReadAllText(path));
        Assert.Single(Directory.GetFiles(folder));
    }

    [Fact]
    public void AnUnwritableFolderIsAnInputErrorAndLeavesNothingBehind()
    {
        string path = Path.Combine(folder, "missing-folder", "car.json");

        var e = Assert.Throws<InputException>(() => CalibrationFile.Save(path, Full()));

        Assert.Contains("cannot write", e.Message, StringComparison.Ordinal);
        Assert.Empty(Directory.GetFileSystemEntries(folder));
    }
}
