using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Verbs;

/// <summary>Loads what a verb was pointed at — log files, or plain-text pulse and accelerometer
/// files — into runs.</summary>
public static class RunInputs
{
    /// <summary>One input and the runs it held.</summary>
    public sealed record Input(string Source, ReaderReport? Reader, IReadOnlyList<DecodedRun> Runs, IReadOnlyList<string>? Warnings = null);

    /// <summary>Loads every input the request names.</summary>
    /// <exception cref="InputException">A file is missing or unusable (one line, naming it).</exception>
    /// <exception cref="UsageException">The request mixes or lacks inputs.</exception>
    public static List<Input> Load(ReportRequest request, CancellationToken cancel)
    {
        bool text = request.Edges != null || request.Counts != null || request.Accel != null;
        if (request.Logs.Count > 0 && text)
        {
            throw new UsageException("give log files or --edges/--counts/--accel, not both");
        }

        if (request.Logs.Count == 0 && !text)
        {
            throw new UsageException("nothing to read: give a log file, or --edges or --counts (with --metres-per-pulse, or --pulses-per-rev and --circumference-m) and/or --accel");
        }

        var inputs = new List<Input>();
        if (text)
        {
            DecodedRun run = TextRunImporter.Import(new TextImportRequest
            {
                EdgesPath = request.Edges?.FullName,
                CountsPath = request.Counts?.FullName,
                AccelPath = request.Accel?.FullName,
                Scale = PulseScale.FromOptions(request.MetresPerPulse, request.PulsesPerRevolution, request.CircumferenceM),
            });
            inputs.Add(new Input(run.Source, null, [run]));
            return inputs;
        }

        if (request.MetresPerPulse != null || request.PulsesPerRevolution != null || request.CircumferenceM != null)
        {
            throw new UsageException("--metres-per-pulse, --pulses-per-rev and --circumference-m are for plain-text inputs; a log carries its own");
        }

        foreach (FileInfo log in request.Logs)
        {
            LogReadResult result = LogReader.ReadFile(log.FullName, cancel);
            inputs.Add(new Input(result.Source, ReaderReport.From(result.Stats), result.Runs, result.Warnings));
        }

        return inputs;
    }
}
