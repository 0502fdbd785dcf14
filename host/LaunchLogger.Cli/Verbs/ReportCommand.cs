using System.CommandLine;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger report</c>: decodes logs (or plain-text pulse and accelerometer
/// files) and reports every run's figures under both conventions.</summary>
public static class ReportCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var logs = new Argument<FileInfo[]>("log") { Description = "Log files written by the box.", Arity = ArgumentArity.ZeroOrMore };
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
        var command = new Command("report", "Rebuild each run and report its figures from standstill and after the rollout.")
        {
            logs, edges, counts, accel, metresPerPulse, pulsesPerRev, circumference, json, units, interval, rollout,
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
            },
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(ReportRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        AnalysisOptions options;
        try
        {
            options = new AnalysisOptions
            {
                Figures = FigureRequest.Standard.With(request.Intervals.Select(SpeedInterval.Parse)),
                RolloutM = request.RolloutM,
            };
        }
        catch (FormatException e)
        {
            error.WriteLine($"launchlogger report: {e.Message}");
            return ExitCode.Usage;
        }

        if (request.RolloutM is { } r && !(r > 0 && r < 10))
        {
            error.WriteLine("launchlogger report: --rollout-m must be more than 0 and less than 10 m");
            return ExitCode.Usage;
        }

        List<RunInputs.Input> inputs;
        try
        {
            inputs = RunInputs.Load(request, cancel);
        }
        catch (InputException e)
        {
            error.WriteLine($"launchlogger report: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (UsageException e)
        {
            error.WriteLine($"launchlogger report: {e.Message}");
            return ExitCode.Usage;
        }

        var reports = new List<RunReport>();
        var failures = new List<string>();
        ReaderReport? reader = null;
        foreach (RunInputs.Input input in inputs)
        {
            reader = ReaderReport.Sum(reader, input.Reader);
            foreach (string warning in input.Warnings ?? [])
            {
                error.WriteLine($"launchlogger report: {input.Source}: {warning}");
            }

            if (input.Runs.Count == 0)
            {
                failures.Add($"{input.Source}: no runs in the input");
            }

            foreach (DecodedRun run in input.Runs)
            {
                cancel.ThrowIfCancellationRequested();
                try
                {
                    reports.Add(RunReportBuilder.Build(RunAnalyzer.Analyze(run, options)));
                }
                catch (AnalysisException e)
                {
                    failures.Add(e.Message);
                }
            }
        }

        foreach (string failure in failures)
        {
            error.WriteLine($"launchlogger report: {failure}");
        }

        if (reports.Count == 0)
        {
            return ExitCode.BadInput;
        }

        var document = new ReportDocument
        {
            ToolVersion = ToolInfo.Version,
            Source = string.Join(", ", inputs.Select(i => i.Source)),
            Reader = reader,
            Runs = reports,
        };
        if (request.Json)
        {
            output.WriteLine(ReportJson.Serialize(document));
        }
        else
        {
            ReportTableWriter.Write(document, output, request.Units, colour: ReferenceEquals(output, Console.Out) && !Console.IsOutputRedirected);
        }

        return failures.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
    }
}
