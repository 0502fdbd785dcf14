using System.CommandLine;
using LaunchLogger.Archive;
using LaunchLogger.Board.Web;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger serve</c>: the live board page for the organiser's laptop, read-only
/// over an archive, on this machine only unless <c>--lan</c> is given.</summary>
public static class ServeCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var archive = ArchiveSupport.ArchiveOption();
        archive.Description = $"The archive file to show (read only; default: ${ArchiveLocation.EnvironmentVariable}, else {ArchiveLocation.Default}).";
        var port = new Option<int>("--port") { Description = $"TCP port (0: any free port; the address is printed).", DefaultValueFactory = _ => BoardServerOptions.DefaultPort };
        var lan = new Option<bool>("--lan") { Description = "Listen on every network interface, not only this machine; every request must then carry the key printed at start-up." };
        var eventName = new Option<string?>("--event") { Description = "The event the board shows when the page names none (default: every run)." };
        var units = new Option<DisplayUnits>("--units") { Description = "Units on the page: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var command = new Command("serve", "Serve the live board: per class, redrawn as runs are filed, each run's card a click away. Read-only; this machine only unless --lan. Ctrl+C stops it.")
        {
            archive, port, lan, eventName, units,
        };
        command.SetAction((parse, cancel) => RunAsync(
            parse.GetValue(archive)?.FullName,
            parse.GetValue(port),
            parse.GetValue(lan),
            parse.GetValue(eventName),
            parse.GetValue(units),
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel).ContinueWith(t => (int)t.Result, CancellationToken.None, TaskContinuationOptions.ExecuteSynchronously, TaskScheduler.Default));
        return command;
    }

    /// <summary>Serves until <paramref name="cancel"/> (Ctrl+C), then stops cleanly.</summary>
    public static async Task<ExitCode> RunAsync(string? archivePath, int port, bool lan, string? eventName, DisplayUnits units, TextWriter output, TextWriter error, CancellationToken cancel)
    {
        if (port is < 0 or > 65535)
        {
            error.WriteLine($"launchlogger serve: --port {port}: give 0 to 65535");
            return ExitCode.Usage;
        }

        string path = archivePath ?? ArchiveLocation.Default;
        BoardServer server;
        try
        {
            server = await BoardServer.StartAsync(new BoardServerOptions
            {
                ArchivePath = path,
                Port = port,
                Lan = lan,
                Event = eventName,
                Units = units,
                ToolVersion = ToolInfo.Version,
            }, cancel);
        }
        catch (ArchiveException e)
        {
            error.WriteLine($"launchlogger serve: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (IOException e)
        {
            error.WriteLine($"launchlogger serve: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (OperationCanceledException)
        {
            return ExitCode.Cancelled;
        }

        await using (server)
        {
            output.WriteLine($"launchlogger serve: the board of {path} (read only)");
            output.WriteLine($"  on this machine: {server.BoardAddress}");
            if (lan)
            {
                foreach (Uri address in server.LanAddresses())
                {
                    output.WriteLine($"  on the LAN:      {address}");
                }

                output.WriteLine($"  key: {server.Key} (every request must carry it: ?key=… or the header {BoardServer.KeyHeader})");
            }

            output.WriteLine("Closed courses only; nobody reads the board from a moving car. Ctrl+C stops the server.");
            output.Flush();
            try
            {
                await Task.Delay(Timeout.Infinite, cancel);
            }
            catch (OperationCanceledException)
            {
            }

            await server.StopAsync();
            output.WriteLine("launchlogger serve: stopped");
        }

        return ExitCode.Ok;
    }
}
