using System.CommandLine;
using System.Globalization;
using System.Text;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Truth;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger demo</c>: the whole job on a built-in scenario. The simulator drives
/// the real firmware core to make a log; the decoder reports it; the simulator's truth shows how
/// close the report came.</summary>
public static class DemoCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var outDir = new Option<DirectoryInfo>("--out") { Description = "Folder for the log, truth and report.", DefaultValueFactory = _ => new DirectoryInfo("launchlogger-out") };
        var scenario = new Option<string>("--scenario") { Description = $"Built-in scenario ({string.Join(", ", BuiltInScenarios.Names)}).", DefaultValueFactory = _ => BuiltInScenarios.DefaultName };
        var seed = new Option<int>("--seed") { Description = "Seed for the simulated sensors' noise.", DefaultValueFactory = _ => 1 };
        var units = new Option<DisplayUnits>("--units") { Description = "Units for tables: imperial or metric.", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var command = new Command("demo", "Simulate a run through the real firmware core, decode its log and report it.") { outDir, scenario, seed, units };
        command.SetAction(parse => (int)Run(
            parse.GetValue(scenario)!,
            parse.GetValue(seed),
            parse.GetValue(outDir)!.FullName,
            parse.GetValue(units),
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error));
        return command;
    }

    /// <summary>Runs the demo.</summary>
    public static ExitCode Run(string scenarioName, int seed, string outDir, DisplayUnits units, TextWriter output, TextWriter error)
    {
        if (!BuiltInScenarios.TryGet(scenarioName, out Scenario? scenario))
        {
            error.WriteLine($"launchlogger demo: unknown scenario '{scenarioName}' (built-in: {string.Join(", ", BuiltInScenarios.Names)})");
            return ExitCode.Usage;
        }

        output.WriteLine($"Simulating '{scenario.Name}' (seed {seed}) through the firmware core…");
        SimulationResult simulation = Simulator.Run(scenario, seed);
        LogReadResult log = LogReader.Read(simulation.LogBytes, scenario.Name + ".log");
        SessionAnalysis session = SessionAnalyzer.Analyze(log.Runs);
        foreach (string failure in session.Failures)
        {
            error.WriteLine($"launchlogger demo: {failure}");
        }

        if (session.Runs.Count == 0)
        {
            error.WriteLine("launchlogger demo: the simulated log held no run that could be analysed");
            return ExitCode.CheckFailed;
        }

        ReportDocument document = RunReportBuilder.Document(session, ToolInfo.Version, log.Source, ReaderReport.From(log.Stats), weather: null, pairs: []);
        var table = new StringWriter(CultureInfo.InvariantCulture);
        ReportTableWriter.Write(document, table, units);
        string stem = Path.Combine(outDir, scenario.Name);
        try
        {
            AtomicFile.WriteAll(
            [
                (stem + ".log", s => s.Write(simulation.LogBytes)),
                (stem + "-truth.json", s => TruthJson.Write(simulation, s)),
                (stem + "-report.json", s => s.Write(Encoding.UTF8.GetBytes(ReportJson.Serialize(document) + "\n"))),
                (stem + "-report.txt", s => s.Write(Encoding.UTF8.GetBytes(table.ToString()))),
            ]);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"launchlogger demo: cannot write to {outDir}: {e.Message}");
            return ExitCode.BadInput;
        }

        ReportTableWriter.Write(document, output, units, colour: ReferenceEquals(output, Console.Out) && !Console.IsOutputRedirected);
        WriteTruthComparison(simulation, session.Runs[0], output);
        output.WriteLine();
        output.WriteLine($"Wrote {stem}.log, {stem}-truth.json, {stem}-report.json and {stem}-report.txt");
        output.WriteLine($"Decode the log yourself: launchlogger report {stem}.log");
        return ExitCode.Ok;
    }

    private static void WriteTruthComparison(SimulationResult simulation, RunAnalysis analysis, TextWriter output)
    {
        FigureSet? truth = simulation.Figures;
        TruthEvents events = simulation.Events;
        output.WriteLine();
        output.WriteLine("Against the simulator's truth (our estimate − truth):");
        if (events.FirstMotionS is { } t0)
        {
            output.WriteLine(FormattableString.Invariant($"  first motion              {(analysis.Figures.FirstMotionS.Value - t0) * 1000,8:+0.0;-0.0;0.0} ms   (± {analysis.Figures.FirstMotionS.Sigma * 1000:0.0} ms claimed)"));
        }

        if (events.RolloutS is { } tr && analysis.Figures.RolloutTimeS is { } rollout)
        {
            output.WriteLine(FormattableString.Invariant($"  rollout mark              {(rollout.Value - tr) * 1000,8:+0.0;-0.0;0.0} ms"));
        }

        if (truth is null)
        {
            return;
        }

        Compare("0-60 mph from standstill", Find(analysis.Figures, "0-60 mph")?.FromStandstillS, Find(truth, "0-60 mph")?.FromStandstillS);
        Compare("0-60 mph after rollout", Find(analysis.Figures, "0-60 mph")?.FromRolloutS, Find(truth, "0-60 mph")?.FromRolloutS);
        Compare("1320 ft elapsed time", FindMark(analysis.Figures)?.FromStandstillS, FindMark(truth)?.FromStandstillS);
        double growth = simulation.Scenario.Tyre.RadiusGrowthAt30Mps;
        if (growth > 0)
        {
            output.WriteLine(FormattableString.Invariant(
                $"  (This car's tyre grows {growth * 100:0.0#} % at 30 m/s, as real tyres do: at speed each pulse covers a little\n   more road than the box's static circumference says, so times to high speeds and long distances come\n   out late. A circumference calibrated at speed removes it; `launchlogger bench accuracy` shows the\n   estimator with a calibrated tyre.)"));
        }

        void Compare(string label, double? ours, double? real)
        {
            if (ours is { } o && real is { } r)
            {
                output.WriteLine(FormattableString.Invariant($"  {label,-26}{(o - r) * 1000,8:+0.0;-0.0;0.0} ms   (truth {r:0.000} s)"));
            }
        }

        static IntervalFigure? Find(FigureSet f, string label) => f.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == label);
        static MarkFigure? FindMark(FigureSet f) => f.DistanceMarks.FirstOrDefault(m => m.Mark.DistanceM > 402 && m.Mark.DistanceM < 403);
    }
}
