using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Capture;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Cli.Tests;

/// <summary>capture given a port that cannot be opened: before, it said only "waiting for
/// /dev/ttyNOPE: cannot open: No such file or directory" and waited, so a mistyped port looked
/// like an unplugged box; now the same line names the ports this machine has (or says it has
/// none) and how to name one.</summary>
public sealed class CapturePortTests
{
    [Theory]
    [InlineData(new[] { "/dev/ttyACM0", "/dev/ttyUSB1" }, "serial ports on this machine: /dev/ttyACM0, /dev/ttyUSB1")]
    [InlineData(new string[0], "no serial ports found on this machine")]
    public void A_port_that_cannot_be_opened_names_the_ports_found(string[] ports, string expected)
    {
        using var folder = new TempFolder();
        using var stop = new CancellationTokenSource();
        var link = new MissingPort("/dev/ttyNOPE", stop);
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CaptureCommand.Run(link, folder.File("capture.log"), null, RunAssignment.None, DisplayUnits.Imperial, json: false, output, error, stop.Token, () => ports);

        Assert.Equal(ExitCode.Ok, code);
        string waiting = Assert.Single(output.ToString().Split('\n'), l => l.StartsWith("waiting for /dev/ttyNOPE", StringComparison.Ordinal));
        Assert.Contains(expected, waiting, StringComparison.Ordinal);
        Assert.Contains("--port PORT", waiting, StringComparison.Ordinal);
    }

    /// <summary>A port that is never there; asking to stop on the first try, so the capture
    /// ends after saying what it waits for (no clock involved).</summary>
    private sealed class MissingPort(string name, CancellationTokenSource stop) : ILink
    {
        public string Name => name;

        public ILinkConnection Open()
        {
            stop.Cancel();
            throw new LinkLostException($"{name}: cannot open: No such file or directory");
        }
    }
}
