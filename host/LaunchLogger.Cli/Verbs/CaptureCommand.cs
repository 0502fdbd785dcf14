using System.CommandLine;
using System.Globalization;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Cli.Capture;
using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger capture --port PORT</c>: records the box's serial stream live —
/// raw bytes to disk first, a status line, a summary row as each run closes — and, with
/// <c>--archive</c>, files each closed run. Lists the ports when none is given.</summary>
public static class CaptureCommand
{
    /// <summary>The box's serial speed (firmware BoxSettings.SerialBaudRate and the Linux board's default).</summary>
    public const int BoxBaudRate = 115200;

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var port = new Option<string?>("--port") { Description = "The box's serial port, e.g. /dev/ttyACM0 or COM3 (without it: list the ports)." };
        var baud = new Option<int>("--baud") { Description = "Line speed, bits/s.", DefaultValueFactory = _ => BoxBaudRate };
        var file = new Option<FileInfo?>("--out") { Description = "Raw capture file (default: capture-<UTC time>.log here); never overwritten." };
        var archive = new Option<string?>("--archive")
        {
            Description = "File each closed run in the archive: this file, or the default archive when no file is given.",
            Arity = ArgumentArity.ZeroOrOne,
        };
        var units = new Option<DisplayUnits>("--units") { Description = "Units on the status line: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var json = new Option<bool>("--json") { Description = "Print one JSON object per line (link events, closed runs with their figures) instead of the status line." };
        var assignment = new RunAssignmentOptions();
        var command = new Command("capture", "Record the box's serial stream live: raw bytes to disk first, a status line, each closed run's figures and verdict; --archive files each run.")
        {
            port, baud, file, archive, units, json,
        };
        assignment.AddTo(command);
        command.SetAction((parse, cancel) =>
        {
            bool archiveGiven = parse.GetResult(archive) is not null;
            string? archivePath = archiveGiven ? parse.GetValue(archive) ?? ArchiveLocation.Default : null;

            // On a worker thread, so the command line holds a task to wait for when Ctrl+C
            // comes and lets the capture flush, close and file the last run before exiting.
            return Task.Run(() => (int)Run(
                parse.GetValue(port),
                parse.GetValue(baud),
                parse.GetValue(file)?.FullName,
                archivePath,
                assignment.Read(parse),
                parse.GetValue(units),
                parse.GetValue(json),
                parse.InvocationConfiguration.Output,
                parse.InvocationConfiguration.Error,
                cancel), CancellationToken.None);
        });
        return command;
    }

    /// <summary>Runs the verb on a serial port.</summary>
    public static ExitCode Run(string? port, int baud, string? outPath, string? archivePath, RunAssignment assignment, DisplayUnits units, bool json,
        TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        if (string.IsNullOrWhiteSpace(port))
        {
            output.WriteLine(PortHint.Found(SerialLink.PortNames()));
            output.WriteLine(PortHint.HowToName);
            return ExitCode.Ok;
        }

        if (baud is < 300 or > 4_000_000)
        {
            error.WriteLine("launchlogger capture: --baud must be from 300 to 4000000");
            return ExitCode.Usage;
        }

        return Run(new SerialLink(port, baud), outPath, archivePath, assignment, units, json, output, error, cancel, SerialLink.PortNames);
    }

    /// <summary>Runs the verb on any link (tests pass their own). <paramref name="portNames"/>
    /// lists the machine's ports for the message when the link cannot be opened.</summary>
    public static ExitCode Run(ILink link, string? outPath, string? archivePath, RunAssignment assignment, DisplayUnits units, bool json,
        TextWriter output, TextWriter error, CancellationToken cancel = default, Func<IReadOnlyList<string>>? portNames = null)
    {
        ArgumentNullException.ThrowIfNull(link);
        outPath ??= Path.GetFullPath(string.Create(CultureInfo.InvariantCulture, $"capture-{DateTime.UtcNow:yyyyMMdd-HHmmss}.log"));
        if (File.Exists(outPath))
        {
            error.WriteLine($"launchlogger capture: {outPath} exists already; captures never overwrite (give another --out)");
            return ExitCode.Usage;
        }

        var options = new CaptureOptions
        {
            OutPath = outPath,
            ArchivePath = archivePath,
            Assignment = assignment,
            Units = units,
            Json = json,
            Overwrite = ReferenceEquals(output, Console.Out) && !Console.IsOutputRedirected,
            PortNames = portNames,
        };
        try
        {
            CaptureResult result = new CaptureSession(link, options, output).Run(cancel);
            foreach (string problem in result.Problems)
            {
                error.WriteLine($"launchlogger capture: {problem}");
            }

            return result.Problems.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
        }
        catch (ArchiveException e)
        {
            error.WriteLine($"launchlogger capture: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"launchlogger capture: {outPath}: {e.Message}");
            return ExitCode.BadInput;
        }
    }
}
