using LaunchLogger.Decoding.Calibration;
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

    /// <summary>Loads the calibration settings file the request names, or null for none.</summary>
    /// <exception cref="InputException">The file is missing or not a settings file.</exception>
    public static CalibrationSettings? LoadSettings(ReportRequest request) =>
        request.Settings is { } file ? CalibrationFile.Load(file.FullName) : null;

    /// <summary>The run with the settings applied (<see cref="CalibrationApplier"/>); as it is without settings.</summary>
    public static DecodedRun Calibrate(DecodedRun run, CalibrationSettings? settings) =>
        settings is null ? run : CalibrationApplier.Apply(run, settings);

    /// <summary>Loads every input the request names, with its calibration settings (if any) applied to every run.</summary>
    /// <exception cref="InputException">A file is missing or unusable (one line, naming it).</exception>
    /// <exception cref="UsageException">The request mixes or lacks inputs.</exception>
    public static List<Input> Load(ReportRequest request, CancellationToken cancel)
    {
        CalibrationSettings? settings = LoadSettings(request);
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
            inputs.Add(new Input(run.Source, null, [Calibrate(run, settings)]));
            return inputs;
        }

        if (request.MetresPerPulse != null || request.PulsesPerRevolution != null || request.CircumferenceM != null)
        {
            throw new UsageException("--metres-per-pulse, --pulses-per-rev and --circumference-m are for plain-text inputs; a log carries its own");
        }

        foreach (FileInfo log in request.Logs)
        {
            LogReadResult result = LogReader.ReadFile(log.FullName, cancel);
            inputs.Add(new Input(result.Source, ReaderReport.From(result.Stats), result.Runs.Select(r => Calibrate(r, settings)).ToList(), result.Warnings));
        }

        return inputs;
    }
}
