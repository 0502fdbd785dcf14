using System.Text.Json.Nodes;
using LaunchLogger.Cli;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Tests.Shared;

/// <summary>What the page tests share: simulated logs of our own invented cars, the command line
/// run in-process, and an archive whose names are hostile HTML.</summary>
internal static class PageFixtures
{
    /// <summary>Names as an organiser might type them, or an attacker: HTML that must show as text.</summary>
    public const string HostileDriver = "<script>alert(\"pwned\")</script> Robin O'Vale & \"Sons\"";

    /// <summary>A car name that would open an image element if not encoded.</summary>
    public const string HostileCar = "\"><img src=x onerror=alert(1)>Blue hatch";

    /// <summary>An event name with markup.</summary>
    public const string HostileEvent = "Spring <b>sprint</b> & co";

    /// <summary>A class name with markup.</summary>
    public const string HostileClass = "Street <i>2.0</i>";

    private static readonly Lazy<SimulationResult> HatchRun = new(() => Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 2));
    private static readonly Lazy<SimulationResult> SecondHatchRun = new(() => Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 3));

    /// <summary>A hatchback's launch and stop.</summary>
    public static byte[] Hatch => HatchRun.Value.LogBytes;

    /// <summary>Another launch of the same hatchback.</summary>
    public static byte[] SecondHatch => SecondHatchRun.Value.LogBytes;

    /// <summary>Runs the command line in-process.</summary>
    public static (int Code, string Output, string Error) Launch(params string[] args)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        int code = LaunchLoggerCommand.InvokeAsync(args, output, error).GetAwaiter().GetResult();
        return (code, output.ToString(), error.ToString());
    }

    /// <summary>Runs the command line and insists it worked (exit 0, or 1 for a doubtful run).</summary>
    public static string CliOk(params string[] args)
    {
        (int code, string output, string error) = Launch(args);
        Assert.True(code is 0 or 1, $"launchlogger {string.Join(' ', args)} exited {code}: {error}");
        return output;
    }

    /// <summary>The report document <c>report --json</c> writes for <paramref name="log"/>.</summary>
    public static JsonNode ReportJson(string log) => JsonNode.Parse(CliOk("report", log, "--json"))!;

    /// <summary>An archive in <paramref name="folder"/> holding <paramref name="logs"/> filed to the
    /// hostile event, class, driver and car; returns its path.</summary>
    public static string HostileArchive(string folder, params string[] logs)
    {
        string archive = Path.Combine(folder, "archive.db");
        CliOk("event", "add", HostileEvent, "--date", "2026-04-12", "--weather", "18.5,1008,62", "--archive", archive);
        CliOk("class", "add", HostileClass, "--archive", archive);
        CliOk("driver", "add", HostileDriver, "--club", "Fenside <u>MC</u>", "--archive", archive);
        CliOk("car", "add", HostileCar, "--class", HostileClass, "--tyre", "195/55 R16", "--pulses-per-rev", "48", "--archive", archive);
        foreach (string log in logs)
        {
            CliOk("import", log, "--event", HostileEvent, "--car", HostileCar, "--driver", HostileDriver, "--archive", archive);
        }

        return archive;
    }

    /// <summary>Writes <paramref name="bytes"/> to <paramref name="name"/> in <paramref name="folder"/>.</summary>
    public static string WriteLog(string folder, string name, byte[] bytes)
    {
        string path = Path.Combine(folder, name);
        File.WriteAllBytes(path, bytes);
        return path;
    }

    /// <summary>A scratch folder, removed by <see cref="IDisposable.Dispose"/>.</summary>
    public sealed class Scratch : IDisposable
    {
        public string Path { get; } = Directory.CreateTempSubdirectory("launchlogger-pages-").FullName;

        public string File(string name) => System.IO.Path.Combine(Path, name);

        public void Dispose()
        {
            try
            {
                Directory.Delete(Path, recursive: true);
            }
            catch (IOException)
            {
            }
        }
    }
}
