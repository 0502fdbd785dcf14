using System.CommandLine;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Plots;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger report</c>: decodes logs (or plain-text pulse and accelerometer
/// files) and reports every run's figures under both conventions.</summary>
public static class ReportCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var logs = new Argument<FileInfo[]>("log") { Description = "Log files written by the box.", Arity = ArgumentArity.ZeroOrMore }.RejectingUnknownOptions();
        var edges = new Option<FileInfo?>("--edges") { Description = "CSV of pulse edge times (header t_s) instead of a log." };
        var counts = new Option<FileInfo?>("--counts") { Description = "CSV of counter readings (header t_lo_s,t_hi_s,count) instead of a log." };
        var accel = new Option<FileInfo?>("--accel") { Description = "CSV of accelerometer samples (header t_s,ax_mps2[,ay_mps2,az_mps2]); ax is forward specific force." };
        var metresPerPulse = new Option<double?>("--metres-per-pulse") { Description = "Distance per pulse for plain-text inputs, m." };
        var pulsesPerRev = new Option<int?>("--pulses-per-rev") { Description = "Pulses per wheel revolution for plain-text inputs." };
        var circumference = new Option<double?>("--circumference-m") { Description = "Rolling circumference for plain-text inputs, m." };
        var json = new Option<bool>("--json") { Description = "Write the report as JSON (see REPORT-JSON.md) instead of tables." };
        var units = new Option<DisplayUnits>("--units") { Description = "Units for tables: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var interval = new Option<string[]>("--interval") { Description = "Extra speed interval to time, e.g. 40-80mph or 0-150kmh (repeatable).", AllowMultipleArgumentsPerToken = false };
        var rollout = new Option<double?>("--rollout-m") { Description = "Rollout distance, m (default: the box's setting, normally 0.3048)." };
        var weather = new Option<string?>("--weather") { Description = "Weather during the runs: T_C,P_hPa,RH_pct (station pressure), e.g. 18.5,1008,62; adds figures corrected to standard air." };
        var pair = new Option<string[]>("--pair") { Description = "Two runs driven in opposite directions, by their index in this report, e.g. 1,2 (repeatable); adds their mean." };
        var brakeReference = new Option<FileInfo?>("--brake-reference") { Description = "A log with a stop made at the grip limit, whose braking grip bounds every launch (without it, only stops among the runs reported that show the limit bound them: a sliding wheel or a deceleration plateau)." };
        var stopFrom = new Option<string[]>("--stop-from") { Description = "Extra nominal speed to correct stopping distances to, e.g. 50mph (repeatable; 60 mph and 100 km/h always)." };
        var settings = new Option<FileInfo?>("--settings") { Description = "Calibration settings file from launchlogger calibrate: its circumference replaces the logs' and its mounting pitch feeds the grade estimate." };
        var pickupWheel = new Option<string?>("--pickup-wheel") { Description = "Which wheel carries the distance pickup: driven, driven_all_wheels (a car with all four wheels driven) or undriven (the settings file's pickup_wheel; without either, not said). With pulses only, a driven wheel's launch and drive slip are taken off the figures, an undriven one has none." };
        pickupWheel.AcceptOnlyFromAmong(PickupWheels.Driven, PickupWheels.Undriven, PickupWheels.DrivenAllWheels);
        var plot = new Option<FileInfo?>("--plot") { Description = "Also draw each run's speed, distance and acceleration to this file (.svg or .png); with several runs, NAME-run1.svg, NAME-run2.svg…" };
        var command = new Command("report", "Rebuild each run and report its figures from standstill and after the rollout.")
        {
            logs, edges, counts, accel, metresPerPulse, pulsesPerRev, circumference, json, units, interval, rollout, weather, pair, brakeReference, stopFrom, settings, pickupWheel, plot,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new ReportRequest
            {
                Logs = parse.GetValue(logs) ?? [],
                Edges = parse.GetValue(edges),
                Counts = parse.GetValue(counts),
                Accel = parse.GetValue(accel),
                MetresPerPulse = parse.GetValue(metresPerPulse),
                PulsesPerRevolution = parse.GetValue(pulsesPerRev),
                CircumferenceM = parse.GetValue(circumference),
                Json = parse.GetValue(json),
                Units = parse.GetValue(units),
                Intervals = parse.GetValue(interval) ?? [],
                RolloutM = parse.GetValue(rollout),
                Weather = parse.GetValue(weather),
                Pairs = parse.GetValue(pair) ?? [],
                BrakeReference = parse.GetValue(brakeReference),
                StopFrom = parse.GetValue(stopFrom) ?? [],
                Settings = parse.GetValue(settings),
                PickupWheel = PickupWheels.Parse(parse.GetValue(pickupWheel)),
                Plot = parse.GetValue(plot)?.FullName,
            },
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(ReportRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        if (request.Plot is { } plotPath && ChartFormats.FromPath(plotPath) is null)
        {
            error.WriteLine($"launchlogger report: --plot '{plotPath}' must end in .svg or .png (the extension picks the format)");
            return ExitCode.Usage;
        }

        // Each run's trace is drawn as the run is analysed and written to a temporary file, then
        // the run is let go; the pictures are moved into place together once all are drawn.
        using AtomicFile.Set? plots = request.Plot is null ? null : new AtomicFile.Set();
        string? plotFailure = null;
        Analysed? analysed = Analyse(request, "report", error, out ExitCode failed, cancel, plots is null ? null : DrawPlot);
        if (analysed is null)
        {
            return failed;
        }

        if (request.Json)
        {
            output.WriteLine(ReportJson.Serialize(analysed.Document));
        }
        else
        {
            ReportTableWriter.Write(analysed.Document, output, request.Units, colour: ReferenceEquals(output, Console.Out) && !Console.IsOutputRedirected);
        }

        if (plots is not null && request.Plot is { } plotFile && !CommitPlots(plots, plotFile, analysed.Document.Runs.Count, plotFailure, error, cancel))
        {
            return ExitCode.BadInput;
        }

        return analysed.Code;

        void DrawPlot(RunAnalysis run, int index)
        {
            if (plotFailure is not null)
            {
                return;
            }

            try
            {
                // Named as one of several for now: the folder is the same whatever the final name.
                plots!.Write(PlotFiles.ForRun(request.Plot!, index, 2), stream => RunCharts.Trace(run, new ChartOptions { Units = request.Units, Title = $"Run {index}: speed, distance and acceleration" })
                    .Write(stream, PlotFiles.FormatOf(request.Plot!, "--plot")));
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                plotFailure = e.Message;
            }
        }
    }

    /// <summary>Moves each run's trace into place (one file, or NAME-runN for several); false, with
    /// the reason on <paramref name="error"/>, when they could not be written (then none is).</summary>
    private static bool CommitPlots(AtomicFile.Set plots, string path, int runs, string? failure, TextWriter error, CancellationToken cancel)
    {
        List<string> targets = Enumerable.Range(1, runs).Select(i => PlotFiles.ForRun(path, i, runs)).ToList();
        try
        {
            if (failure is not null || plots.Count != runs)
            {
                throw new IOException(failure ?? "a run's picture was not drawn");
            }

            plots.Commit(targets, cancel);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"launchlogger report: cannot write the plot: {e.Message}");
            return false;
        }

        foreach (string file in targets)
        {
            error.WriteLine($"launchlogger report: wrote {file}");
        }

        return true;
    }

    /// <summary>What <see cref="Analyse"/> made of a request.</summary>
    /// <param name="Document">The report document (what --json writes).</param>
    /// <param name="Code">The exit code the report gives: 0 only when every run asked for was
    /// reported and judged valid; a doubtful or invalid run, or an input that yielded no run,
    /// makes the result partial.</param>
    public sealed record Analysed(ReportDocument Document, ExitCode Code);

    /// <summary>Reads, analyses and reports what <paramref name="request"/> names, as the report
    /// verb does (other verbs that show the report's figures use this, so their numbers are the
    /// report's); problems go to <paramref name="error"/> prefixed by <paramref name="verb"/>.</summary>
    /// <returns>Null when nothing could be reported; then <paramref name="failed"/> says why.</returns>
    /// <remarks>Runs are let go as they are reported; a caller that needs more of each run (its
    /// plots) takes it from <paramref name="eachRun"/>, given every run's whole analysis and its
    /// 1-based index in the report as soon as it is analysed.</remarks>
    public static Analysed? Analyse(ReportRequest request, string verb, TextWriter error, out ExitCode failed, CancellationToken cancel = default, Action<RunAnalysis, int>? eachRun = null)
    {
        AnalysisOptions options;
        Weather? weather;
        try
        {
            weather = request.Weather is { } w ? Weather.Parse(w) : null;
            options = new AnalysisOptions
            {
                Figures = FigureRequest.Standard.With(request.Intervals.Select(SpeedInterval.Parse)),
                RolloutM = request.RolloutM,
                Weather = weather,
                StopFromMps = request.StopFrom.Select(SpeedInterval.ParseSpeedMps).ToList(),
                BrakeSlip = request.BrakeSlip,
            };
        }
        catch (FormatException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            failed = ExitCode.Usage;
            return null;
        }

        if (request.RolloutM is { } r && !(r > 0 && r < 10))
        {
            error.WriteLine($"launchlogger {verb}: --rollout-m must be more than 0 and less than 10 m");
            failed = ExitCode.Usage;
            return null;
        }

        List<RunInputs.Input> inputs;
        RunInputs.Input? referenceLog = null;
        try
        {
            inputs = RunInputs.Load(request, cancel);
            options = options with { Calibration = RunInputs.LoadSettings(request) };
            if (request.BrakeReference is { } reference)
            {
                // Read as its runs are analysed, one at a time, like the logs reported.
                referenceLog = new RunInputs.Input(reference.FullName, null, cancel);
            }
        }
        catch (InputException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            failed = ExitCode.BadInput;
            return null;
        }
        catch (UsageException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            failed = ExitCode.Usage;
            return null;
        }

        // Runs are read, analysed and reported one at a time; only each run's report entry and
        // figures are kept, so a season's log takes the memory of its largest run.
        StreamedSession<RunReport> session = SessionAnalyzer.AnalyzeEach(
            inputs.SelectMany(i => i.Runs),
            (analysis, index) =>
            {
                eachRun?.Invoke(analysis, index);
                return RunReportBuilder.Build(analysis, index);
            },
            options,
            referenceLog?.Runs,
            cancel);
        if (referenceLog is { RunCount: 0 })
        {
            error.WriteLine($"launchlogger {verb}: {new InputException(request.BrakeReference!.FullName, 0, "the braking reference holds no run").Message}");
            failed = ExitCode.BadInput;
            return null;
        }

        ReaderReport? reader = null;
        var failures = new List<string>();
        foreach (RunInputs.Input input in inputs)
        {
            reader = ReaderReport.Sum(reader, input.Reader);
            foreach (string warning in input.Warnings)
            {
                error.WriteLine($"launchlogger {verb}: {input.Source}: {warning}");
            }

            if (input.RunCount == 0 && input.BenchRests.Count == 0)
            {
                failures.Add($"{input.Source}: no runs in the input");
            }
        }

        failures.AddRange(session.Failures);
        foreach (string failure in failures)
        {
            error.WriteLine($"launchlogger {verb}: {failure}");
        }

        List<BenchRestReport> rests = inputs.SelectMany(i => i.BenchRests).Select(BenchRestReport.From).ToList();
        if (session.Runs.Count == 0 && rests.Count == 0)
        {
            failed = ExitCode.BadInput;
            return null;
        }

        List<(int A, int B)> pairs;
        try
        {
            pairs = request.Pairs.Select(p => ParsePair(p, session.Runs.Count)).ToList();
        }
        catch (UsageException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            failed = ExitCode.Usage;
            return null;
        }

        ReportDocument document = RunReportBuilder.Document(session, ToolInfo.Version, string.Join(", ", inputs.Select(i => i.Source)), reader, weather, pairs) with { BenchRests = rests };
        // 0 only when every run asked for was reported and judged valid; a doubtful or invalid
        // run, or an input that yielded no run, makes the result partial (ExitCode.Partial).
        bool allValid = session.Runs.All(r => r.Verdict.Level == VerdictLevel.Valid);
        failed = ExitCode.Ok;
        return new Analysed(document, failures.Count == 0 && allValid ? ExitCode.Ok : ExitCode.Partial);
    }

    private static (int A, int B) ParsePair(string text, int runs)
    {
        string[] parts = text.Split(',');
        if (parts.Length != 2 || !int.TryParse(parts[0], out int a) || !int.TryParse(parts[1], out int b))
        {
            throw new UsageException($"--pair '{text}' must be two run indexes, e.g. 1,2");
        }

        if (a < 1 || b < 1 || a > runs || b > runs || a == b)
        {
            throw new UsageException($"--pair '{text}' must name two different runs from 1 to {runs}");
        }

        return (a, b);
    }
}
