using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Tests;

public class SimulateCommandTests
{
    [Fact]
    public void WritesALogTheReaderDecodesAndTheTruth()
    {
        using var folder = new TempFolder();
        string log = folder.File("hatch.log");
        string truth = folder.File("hatch-truth.json");
        var output = new StringWriter();

        ExitCode code = SimulateCommand.Run("club-hatch", 4, log, truth, listOnly: false, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        LogReadResult read = LogReader.ReadFile(log);
        Assert.Single(read.Runs);
        Assert.False(read.Stats.HasDamage);
        using JsonDocument json = JsonDocument.Parse(File.ReadAllText(truth));
        Assert.Equal(JsonValueKind.Object, json.RootElement.ValueKind);
        Assert.Empty(Directory.GetFiles(folder.Path, "*.part"));
    }

    [Fact]
    public void AnUnknownScenarioWritesNothing()
    {
        using var folder = new TempFolder();
        var error = new StringWriter();
        ExitCode code = SimulateCommand.Run("no-such-car", 1, folder.File("x.log"), null, listOnly: false, new StringWriter(), error);
        Assert.NotEqual(ExitCode.Ok, code);
        Assert.Contains("unknown scenario", error.ToString());
        Assert.Empty(Directory.GetFiles(folder.Path));
    }
}
