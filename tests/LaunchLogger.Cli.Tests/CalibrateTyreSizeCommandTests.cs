using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Calibration;
using UnitsNet;

namespace LaunchLogger.Cli.Tests;

public class CalibrateTyreSizeCommandTests
{
    [Fact]
    public void TheSizeMarkingGivesTheRimPlusTwoSidewalls()
    {
        var output = new StringWriter();

        ExitCode code = CalibrateTyreSizeCommand.Run("205/55R16", null, null, json: true, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement root = json.RootElement;

        // The metric size designation (ISO 4000-1; ETRTO standards manual): a 16-inch rim, inches
        // to millimetres by UnitsNet, and two sidewalls of 55 % of 205 mm. Tyre tables list
        // 205/55R16 at about 632 mm across (from memory).
        double rimMm = Length.FromInches(16).Millimeters;
        double diameterMm = rimMm + (2 * 205 * 0.55);
        Assert.Equal(631.9, diameterMm, 1);
        Assert.Equal(diameterMm / 1000, root.GetProperty("diameter_m").GetDouble(), 9);
        Assert.Equal(Math.PI * diameterMm / 1000, root.GetProperty("static_circumference_m").GetDouble(), 9);

        // What the report will take: 1 % less, 1 % σ, the typical growth (TyrePrior).
        double rolling = root.GetProperty("rolling_circumference_taken_m").GetDouble();
        Assert.Equal(0.99 * Math.PI * diameterMm / 1000, rolling, 9);
        Assert.Equal(0.01 * rolling, root.GetProperty("rolling_sigma_m").GetDouble(), 9);
    }

    [Theory]
    [InlineData("205/55 R16", 205, 55, 16)]
    [InlineData("225/40ZR18", 225, 40, 18)]
    [InlineData("195/65r15", 195, 65, 15)]
    [InlineData("315/30R21.5", 315, 30, 21.5)]
    public void SizeMarkingsAreReadAsWritten(string text, int width, int aspect, double rim)
    {
        Assert.Equal(new TyreSize(width, aspect, rim), TyreSize.Parse(text));
    }

    [Theory]
    [InlineData("205/55")]
    [InlineData("P205/55R16 extra")]
    [InlineData("50/55R16")]
    [InlineData("205/55R30")]
    [InlineData("6.50-13")]
    public void AnythingElseIsNoSize(string text)
    {
        Assert.Null(TyreSize.Parse(text));
    }

    [Fact]
    public void ATapedFigureIsSavedAndTheOtherSettingsKept()
    {
        using var folder = new TempFolder();
        string settings = folder.Write("car.json", "{ \"notes\": \"club roadster\", \"mounting_pitch_deg\": 1.25 }");
        var output = new StringWriter();

        ExitCode code = CalibrateTyreSizeCommand.Run(null, 1.985, new FileInfo(settings), json: false, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        CalibrationSettings saved = CalibrationFile.Load(settings);
        Assert.Equal(1.985, saved.StaticCircumferenceM);
        Assert.Equal("club roadster", saved.Notes);
        Assert.Equal(1.25, saved.MountingPitchDeg);
        Assert.Null(saved.CircumferenceM);
        Assert.Contains("Saved static_circumference_m", output.ToString(), StringComparison.Ordinal);
        Assert.Contains("1.96515 m", output.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void ARolledCircumferenceAlreadySavedIsPointedOut()
    {
        using var folder = new TempFolder();
        string settings = folder.Write("car.json", "{ \"circumference_m\": 1.95, \"circumference_sigma_m\": 0.0004 }");
        var error = new StringWriter();

        ExitCode code = CalibrateTyreSizeCommand.Run("205/55R16", null, new FileInfo(settings), json: false, new StringWriter(), error);

        Assert.Equal(ExitCode.Ok, code);
        Assert.Contains("already hold a rolled circumference", error.ToString(), StringComparison.Ordinal);
        Assert.Equal(1.95, CalibrationFile.Load(settings).CircumferenceM);
    }

    [Theory]
    [InlineData(null, null, "either --size")]
    [InlineData("205/55R16", 1.98, "either --size")]
    [InlineData("big", null, "not a metric size marking")]
    [InlineData(null, 19.8, "0.5 to 5 m")]
    public void WrongRequestsAreUsageErrorsInOneLine(string? size, double? taped, string expected)
    {
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateTyreSizeCommand.Run(size, taped, null, json: false, output, error);

        Assert.Equal(ExitCode.Usage, code);
        Assert.Equal("", output.ToString());
        Assert.Contains(expected, error.ToString(), StringComparison.Ordinal);
        Assert.Single(error.ToString().TrimEnd().Split('\n'));
    }
}
