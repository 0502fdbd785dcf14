using System.CommandLine;
using System.Globalization;
using LaunchLogger.Cli.Output;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Truth;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger simulate</c>: runs a vehicle and sensor scenario through the real
/// firmware core and writes the log it produces, and optionally the ground truth as JSON.</summary>
public static class SimulateCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var scenario = new Option<string>("--scenario")
        {
            Description = $"A built-in scenario ({string.Join(", ", BuiltInScenarios.Names)}) or a scenario JSON file.",
            DefaultValueFactory = _ => BuiltInScenarios.DefaultName,
        };
        var seed = new Option<int>("--seed") { Description = "Seed for every random draw; the same seed gives the same log bytes.", DefaultValueFactory = _ => 1 };
        var output = new Option<FileInfo?>("--out") { Description = "Where to write the log, e.g. RUN.log (required unless --list)." };
        var truth = new Option<FileInfo?>("--truth") { Description = "Where to write the ground truth as JSON (optional)." };
        var list = new Option<bool>("--list") { Description = "List the built-in scenarios and exit." };
        var command = new Command("simulate", "Simulate a car and the box's sensors, run them through the firmware core, and write the log and the truth.")
        {
            scenario, seed, output, truth, list,
        };
        command.SetAction((parse, cancellationToken) => Task.FromResult((int)Run(
            parse.GetValue(scenario) ?? BuiltInScenarios.DefaultName,
            parse.GetValue(seed),
            parse.GetValue(output)?.FullName,
            parse.GetValue(truth)?.FullName,
            parse.GetValue(list),
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancellationToken)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    /// <param name="scenarioNameOrFile">A built-in scenario's name or a path to a scenario file.</param>
    /// <param name="seed">The random seed.</param>
    /// <param name="logPath">Where to write the log; required unless <paramref name="listOnly"/>.</param>
    /// <param name="truthPath">Where to write the truth JSON, or null.</param>
    /// <param name="listOnly">True to list the built-in scenarios only.</param>
    /// <param name="output">Receives the summary.</param>
    /// <param name="error">Receives one-line errors.</param>
    /// <param name="cancellationToken">Stops the simulation.</param>
    public static ExitCode Run(string scenarioNameOrFile, int seed, string? logPath, string? truthPath, bool listOnly,
        TextWriter output, TextWriter error, CancellationToken cancellationToken = default)
    {
        if (listOnly)
        {
            foreach (Scenario s in BuiltInScenarios.Scenarios)
            {
                string mark = s.Name == BuiltInScenarios.DefaultName ? " (default)" : "";
                output.WriteLine($"{s.Name}{mark}: {s.Description}");
            }

            return ExitCode.Ok;
        }

        if (string.IsNullOrWhiteSpace(logPath))
        {
            error.WriteLine("simulate: --out RUN.log is required");
            return ExitCode.Usage;
        }

        if (!TryResolve(scenarioNameOrFile, error, out Scenario? scenario))
        {
            return ExitCode.BadInput;
        }

        foreach (string? path in new[] { logPath, truthPath })
        {
            string? folder = path is null ? null : Path.GetDirectoryName(path);
            if (!string.IsNullOrEmpty(folder) && !Directory.Exists(folder))
            {
                error.WriteLine($"simulate: folder '{folder}' does not exist");
                return ExitCode.BadInput;
            }
        }

        SimulationResult result;
        try
        {
            result = Simulator.Run(scenario, seed, cancellationToken);
        }
        catch (OperationCanceledException)
        {
            error.WriteLine("simulate: cancelled; nothing written");
            return ExitCode.Cancelled;
        }

        var files = new List<(string Path, Action<Stream> Write)> { (logPath, stream => stream.Write(result.LogBytes)) };
        if (truthPath != null)
        {
            files.Add((truthPath, stream => TruthJson.Write(result, stream)));
        }

        try
        {
            AtomicFile.WriteAll(files);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"simulate: cannot write the output: {e.Message.ReplaceLineEndings(" ")}");
            return ExitCode.BadInput;
        }

        Summarise(result, logPath, truthPath, output);
        return ExitCode.Ok;
    }

    private static bool TryResolve(string nameOrFile, TextWriter error, [System.Diagnostics.CodeAnalysis.NotNullWhen(true)] out Scenario? scenario)
    {
        if (BuiltInScenarios.TryGet(nameOrFile, out scenario))
        {
            return true;
        }

        bool looksLikeFile = File.Exists(nameOrFile) || nameOrFile.EndsWith(".json", StringComparison.OrdinalIgnoreCase)
            || nameOrFile.Contains(Path.DirectorySeparatorChar) || nameOrFile.Contains(Path.AltDirectorySeparatorChar);
        if (!looksLikeFile)
        {
            error.WriteLine($"simulate: unknown scenario '{nameOrFile}' (built-in: {string.Join(", ", BuiltInScenarios.Names)}; or give a scenario .json file)");
            return false;
        }

        try
        {
            scenario = ScenarioFile.Load(nameOrFile);
            return true;
        }
        catch (ScenarioException e)
        {
            error.WriteLine($"simulate: {e.Message}");
            return false;
        }
    }

    private static void Summarise(SimulationResult result, string logPath, string? truthPath, TextWriter output)
    {
        TruthEvents e = result.Events;
        CultureInfo inv = CultureInfo.InvariantCulture;
        string S(double? v, string format = "F4") => v is { } x ? x.ToString(format, inv) : "-";
        output.WriteLine($"simulated '{result.Scenario.Name}' (seed {result.Seed}): {result.DurationS.ToString("F1", inv)} s, {result.BoxRuns} run(s) logged");
        output.WriteLine($"  log    {logPath} ({result.LogBytes.Length.ToString("N0", inv)} bytes)");
        if (truthPath != null)
        {
            output.WriteLine($"  truth  {truthPath}");
        }

        output.WriteLine($"  first motion {S(e.FirstMotionS)} s, rollout {S(e.RolloutS)} s at {S(e.RolloutSpeedMps, "F3")} m/s (box clock)");
        if (result.Figures is { } f)
        {
            var zeroTo60 = f.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == "0-60 mph");
            if (zeroTo60 != null)
            {
                output.WriteLine($"  0-60 mph {S(zeroTo60.FromStandstillS, "F3")} s from standstill, {S(zeroTo60.FromRolloutS, "F3")} s after the 1-ft rollout (truth)");
            }
        }

        if (e.StandstillS != null)
        {
            output.WriteLine($"  braked from {S(e.BrakeOnsetSpeedMps, "F2")} m/s, stopped in {S(e.StoppingDistanceM, "F2")} m");
        }
    }
}
