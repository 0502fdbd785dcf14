using System.Net;
using System.Text.RegularExpressions;
using LaunchLogger.Cli;
using LaunchLogger.Cli.Verbs;
using static LaunchLogger.Tests.Shared.PageFixtures;

namespace LaunchLogger.Board.Web.Tests;

public partial class ServeCommandTests
{
    [Fact]
    public async Task Serve_prints_its_address_serves_until_stopped_and_then_lets_go_of_the_port()
    {
        using var temp = new Scratch();
        string archive = HostileArchive(temp.Path, WriteLog(temp.Path, "hatch.log", Hatch));
        var written = new StringWriter();
        TextWriter output = TextWriter.Synchronized(written);

        // The synchronized writer locks on itself (MethodImplOptions.Synchronized), so reading
        // under the same lock never meets a write half done.
        string Output()
        {
            lock (output)
            {
                return written.ToString();
            }
        }

        using var error = new StringWriter();
        using var stop = new CancellationTokenSource();
        Task<ExitCode> serving = ServeCommand.RunAsync(archive, 0, lan: false, eventName: null, DisplayUnits.Metric, output, error, stop.Token);

        Match address = Match.Empty;
        using var giveUp = new CancellationTokenSource(TimeSpan.FromMinutes(2));
        while (!(address = Address().Match(Output())).Success)
        {
            Assert.False(serving.IsCompleted, "serve ended early: " + error);
            await Task.Delay(50, giveUp.Token);
        }

        var url = new Uri(address.Value);
        Assert.Equal("127.0.0.1", url.Host);
        Assert.Contains("Closed courses only", Output(), StringComparison.Ordinal);
        using var client = new HttpClient();
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync(url)).StatusCode);

        // Ctrl+C: the verb's cancellation. It stops cleanly, exit 0, and the port is closed.
        await stop.CancelAsync();
        Assert.Equal(ExitCode.Ok, await serving.WaitAsync(giveUp.Token));
        Assert.EndsWith("stopped" + Environment.NewLine, Output(), StringComparison.Ordinal);
        await Assert.ThrowsAsync<HttpRequestException>(() => client.GetAsync(url));
    }

    [Fact]
    public async Task Serve_refuses_a_missing_archive_and_a_bad_port()
    {
        using var temp = new Scratch();
        using var output = new StringWriter();
        using var error = new StringWriter();
        Assert.Equal(ExitCode.BadInput, await ServeCommand.RunAsync(temp.File("none.db"), 0, false, null, DisplayUnits.Imperial, output, error, CancellationToken.None));
        Assert.False(File.Exists(temp.File("none.db")));
        Assert.Equal(ExitCode.Usage, await ServeCommand.RunAsync(temp.File("none.db"), 70000, false, null, DisplayUnits.Imperial, output, error, CancellationToken.None));
    }

    [GeneratedRegex(@"http://127\.0\.0\.1:\d+/")]
    private static partial Regex Address();
}
