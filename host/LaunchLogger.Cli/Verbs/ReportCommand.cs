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
        var plot = new Option<FileInfo?>("--plot") { Description = "Also draw each run's speed, distance and acceleration to this file (.svg or .png); with several runs, NAME-run1.svg, NAME-run2.svg…" };
        var command = new Command("report", "Rebuild each run and report its figures from standstill and after the rollout.")
        {
            logs, edges, counts, accel, metresPerPulse, pulsesPerRev, circumference, json, units, interval, rollout, weather, pair, brakeReference, stopFrom, settings, plot,
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

        Analysed? analysed = Analyse(request, "report", error, out ExitCode failed, cancel, keepRuns: request.Plot is not null);
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

        if (request.Plot is { } plotFile && !WritePlots(analysed.Session!, plotFile, request.Units, error, cancel))
        {
            return ExitCode.BadInput;
        }

        return analysed.Code;
    }

    /// <summary>Writes each run's trace (one file, or NAME-runN for several); false, with the
    /// reason on <paramref name="error"/>, when they could not be written (then none is).</summary>
    private static bool WritePlots(SessionAnalysis session, string path, DisplayUnits units, TextWriter error, CancellationToken cancel)
    {
        int count = session.Runs.Count;
        var charts = session.Runs.Select((run, i) => (
            PlotFiles.ForRun(path, i + 1, count),
            (Func<Chart>)(() => RunCharts.Trace(run, new ChartOptions { Units = units, Title = $"Run {i + 1}: speed, distance and acceleration" })))).ToList();
        try
        {
            PlotFiles.Write(charts, cancel);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"launchlogger report: cannot write the plot: {e.Message}");
            return false;
        }

        foreach ((string file, _) in charts)
        {
            error.WriteLine($"launchlogger report: wrote {file}");
        }

        return true;
    }

    /// <summary>What <see cref="Analyse"/> made of a request.</summary>
    /// <param name="Session">Every run analysed, with its reconstruction; null unless asked for
    /// (keepRuns): kept, a long log's runs take memory in proportion to the log.</param>
    /// <param name="Document">The report document (what --json writes).</param>
    /// <param name="Code">The exit code the report gives: 0 only when every run asked for was
    /// reported and judged valid; a doubtful or invalid run, or an input that yielded no run,
    /// makes the result partial.</param>
    public sealed record Analysed(SessionAnalysis? Session, ReportDocument Document, ExitCode Code);

    /// <summary>Reads, analyses and reports what <paramref name="request"/> names, as the report
    /// verb does (other verbs that show the report's figures use this, so their numbers are the
    /// report's); problems go to <paramref name="error"/> prefixed by <paramref name="verb"/>.</summary>
    /// <returns>Null when nothing could be reported; then <paramref name="failed"/> says why.</returns>
    /// <remarks>With <c>keepRuns</c> every run's whole analysis (for plots and cards) is kept in
    /// <see cref="Analysed.Session"/>; otherwise runs are let go as they are reported.</remarks>
    public static Analysed? Analyse(ReportRequest request, string verb, TextWriter error, out ExitCode failed, CancellationToken cancel = default, bool keepRuns = false)
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
        List<DecodedRun> referenceRuns = [];
        try
        {
            inputs = RunInputs.Load(request, cancel);
            options = options with { Calibration = RunInputs.LoadSettings(request) };
            if (request.BrakeReference is { } reference)
            {
                referenceRuns = [.. LogReader.ReadFile(reference.FullName, cancel).Runs];
                if (referenceRuns.Count == 0)
                {
                    throw new InputException(reference.FullName, 0, "the braking reference holds no run");
                }
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
        // figures are kept (and its whole analysis only when asked), so a season's log takes the
        // memory of its largest run.
        StreamedSession<(RunReport Report, RunAnalysis? Analysis)> streamed = SessionAnalyzer.AnalyzeEach(
            inputs.SelectMany(i => i.Runs), (analysis, index) => (RunReportBuilder.Build(analysis, index), keepRuns ? analysis : null), options, referenceRuns, cancel);
        var session = new StreamedSession<RunReport>
        {
            Runs = streamed.Runs.Select(r => new StreamedRun<RunReport>(r.Kept.Report, r.Figures, r.Verdict)).ToList(),
            Bound = streamed.Bound,
            Failures = streamed.Failures,
        };
        ReaderReport? reader = null;
        var failures = new List<string>();
        foreach (RunInputs.Input input in inputs)
        {
            reader = ReaderReport.Sum(reader, input.Reader);
            foreach (string warning in input.Warnings)
            {
                error.WriteLine($"launchlogger {verb}: {input.Source}: {warning}");
            }

            if (input.RunCount == 0)
            {
                failures.Add($"{input.Source}: no runs in the input");
            }
        }

        failures.AddRange(session.Failures);
        foreach (string failure in failures)
        {
            error.WriteLine($"launchlogger {verb}: {failure}");
        }

        if (session.Runs.Count == 0)
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

        ReportDocument document = RunReportBuilder.Document(session, ToolInfo.Version, string.Join(", ", inputs.Select(i => i.Source)), reader, weather, pairs);
        // 0 only when every run asked for was reported and judged valid; a doubtful or invalid
        // run, or an input that yielded no run, makes the result partial (ExitCode.Partial).
        bool allValid = session.Runs.All(r => r.Verdict.Level == VerdictLevel.Valid);
        SessionAnalysis? kept = keepRuns
            ? new SessionAnalysis { Runs = streamed.Runs.Select(r => r.Kept.Analysis!.WithVerdict(r.Verdict)).ToList(), Bound = streamed.Bound, Failures = streamed.Failures }
            : null;
        failed = ExitCode.Ok;
        return new Analysed(kept, document, failures.Count == 0 && allValid ? ExitCode.Ok : ExitCode.Partial);
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
