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
        var units = new Option<DisplayUnits>("--units") { Description = "Units for tables: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
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
        WriteTruthComparison(simulation, session.Runs[0], units, output);
        output.WriteLine();
        output.WriteLine($"Wrote {stem}.log, {stem}-truth.json, {stem}-report.json and {stem}-report.txt");
        output.WriteLine($"Decode the log yourself: launchlogger report {stem}.log");
        return ExitCode.Ok;
    }

    private static void WriteTruthComparison(SimulationResult simulation, RunAnalysis analysis, DisplayUnits units, TextWriter output)
    {
        FigureSet? truth = simulation.Figures;
        TruthEvents events = simulation.Events;
        output.WriteLine();
        output.WriteLine("Against the simulator's truth (error = our estimate − truth; in σ = error ÷ our stated σ):");
        output.WriteLine("  figure                              estimate        truth        error     ± σ    in σ");
        FigureSet ours = analysis.Figures;
        if (events.FirstMotionS is { } t0)
        {
            Row("first motion (box clock)", ours.FirstMotionS.Value, t0, ours.FirstMotionS.Sigma, Time);
        }

        if (events.RolloutS is { } tr && ours.RolloutTimeS is { } rollout)
        {
            Row("rollout mark (box clock)", rollout.Value, tr, rollout.Sigma, Time);
        }

        if (truth is not null)
        {
            foreach (IntervalFigure mine in ours.SpeedIntervals)
            {
                IntervalFigure? real = truth.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == mine.Interval.Label);
                bool fromRest = mine.Interval.FromMps <= 0;
                Row(mine.Interval.Label + (fromRest ? " from standstill" : ""), mine.FromStandstillS, real?.FromStandstillS, mine.UncertaintyS, Time);
                if (fromRest)
                {
                    Row(mine.Interval.Label + " after rollout", mine.FromRolloutS, real?.FromRolloutS, mine.FromRolloutUncertaintyS, Time);
                }
            }

            foreach (MarkFigure mine in ours.DistanceMarks)
            {
                MarkFigure? real = truth.DistanceMarks.FirstOrDefault(m => Math.Abs(m.Mark.DistanceM - mine.Mark.DistanceM) < 1e-6);
                Row(mine.Mark.Label + " from standstill", mine.FromStandstillS, real?.FromStandstillS, mine.UncertaintyS, Time);
                Row(mine.Mark.Label + " after rollout", mine.FromRolloutS, real?.FromRolloutS, mine.FromRolloutUncertaintyS, Time);
                Row(mine.Mark.Label + " trap speed", mine.TrapSpeedMps, real?.TrapSpeedMps, mine.TrapSpeedUncertaintyMps, Speed);
            }
        }

        if (analysis.Braking is { } braking && events.StoppingDistanceM is { } stop)
        {
            if (events.BrakeOnsetS is { } onset)
            {
                Row("brake onset (box clock)", braking.OnsetS.Value, onset, braking.OnsetS.Sigma, Time);
            }

            Row("stopping distance", braking.StoppingDistanceM.Value, stop, braking.StoppingDistanceM.Sigma, Length);
        }

        if (analysis.Grade is { } grade)
        {
            double truthRad = Math.Atan(events.GradePercent / 100);
            Row("grade at staging", grade.AngleRad, truthRad, grade.SigmaRad, Grade);
        }

        double growth = simulation.Scenario.Tyre.RadiusGrowthAt30Mps;
        if (growth > 0)
        {
            output.WriteLine(FormattableString.Invariant(
                $"  (This car's tyre grows {growth * 100:0.0#} % at 30 m/s ({units.Speed(30):0} {units.SpeedUnit()}), as real tyres do: at speed each pulse covers a little\n   more road than the box's static circumference says, so times to high speeds and long distances come\n   out late. Until the tyre is calibrated at speed that is part of σ; `launchlogger bench accuracy` shows\n   the estimator both ways.)"));
        }

        void Row(string label, double? estimate, double? real, double? sigma, Func<double, string> show)
        {
            if (estimate is not { } e || real is not { } r)
            {
                return;
            }

            string inSigma = sigma is { } s && s > 0 ? FormattableString.Invariant($"{(e - r) / s,7:+0.0;−0.0;0.0}") : "      —";
            output.WriteLine(FormattableString.Invariant($"  {label,-32}{show(e),12} {show(r),12} {Signed(show, e - r),12} {(sigma is { } sg ? show(sg) : "—"),9} {inSigma}"));
        }

        static string Signed(Func<double, string> show, double value) => (value >= 0 ? "+" : "−") + show(Math.Abs(value));
        static string Time(double s) => FormattableString.Invariant($"{s:0.0000} s");
        // Speeds and distances in the tables' units, as the report above gives them.
        string Speed(double mps) => FormattableString.Invariant($"{units.Speed(mps):0.000} {units.SpeedUnit()}");
        string Length(double m) => FormattableString.Invariant($"{units.Distance(m):0.000} {units.DistanceUnit()}");
        static string Grade(double rad) => FormattableString.Invariant($"{Math.Tan(rad) * 100:0.00} %");
    }
}
