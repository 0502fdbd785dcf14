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

    [Fact]
    public void AnUnknownScenarioIsAUsageErrorAndWritesNothing()
    {
        using var folder = new TempFolder();
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, DemoCommand.Run("no-such-car", 1, folder.Path, DisplayUnits.Imperial, new StringWriter(), error));
        Assert.Contains("unknown scenario", error.ToString());
        Assert.Empty(Directory.GetFiles(folder.Path));
    }
}
