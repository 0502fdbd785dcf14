using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Verbs;

/// <summary>Loads what a verb was pointed at — log files, or plain-text pulse and accelerometer
/// files — into runs.</summary>
public static class RunInputs
{
    /// <summary>One input and its runs. A log's runs are read as they are enumerated (once), one
    /// at a time, so that a long log is never held whole; its reader counters and warnings are
    /// known once they have all been read.</summary>
    public sealed class Input
    {
        private readonly IEnumerable<DecodedRun> runs;

        /// <summary>An input whose runs are all known.</summary>
        public Input(string source, IReadOnlyList<DecodedRun> runs)
        {
            Source = source;
            this.runs = runs;
            Done = true;
        }

        /// <summary>A log read lazily from <paramref name="path"/> (opened now: a missing file fails here).</summary>
        /// <exception cref="InputException">The file is missing or cannot be opened.</exception>
        public Input(string path, CalibrationSettings? settings, CancellationToken cancel)
        {
            Source = Path.GetFileName(path);
            runs = LogReader.ReadFileRuns(path, Finish, cancel).Select(r => Calibrate(r, settings));
        }

        /// <summary>The input's name.</summary>
        public string Source { get; }

        /// <summary>The runs, read as enumerated; enumerate once.</summary>
        public IEnumerable<DecodedRun> Runs => Counted();

        /// <summary>How many runs have been read.</summary>
        public int RunCount { get; private set; }

        /// <summary>True once every run has been read.</summary>
        public bool Done { get; private set; }

        /// <summary>The reader's counters (logs, once read).</summary>
        public ReaderReport? Reader { get; private set; }

        /// <summary>The log's bench rests (once read): not runs.</summary>
        public IReadOnlyList<BenchRestRecord> BenchRests { get; private set; } = [];

        /// <summary>The log's own warnings (once read).</summary>
        public IReadOnlyList<string> Warnings { get; private set; } = [];

        private IEnumerable<DecodedRun> Counted()
        {
            foreach (DecodedRun run in runs)
            {
                RunCount++;
                yield return run;
            }

            Done = true;
        }

        private void Finish(LogReadResult end)
        {
            Reader = ReaderReport.From(end.Stats);
            Warnings = end.Warnings;
            BenchRests = end.BenchRests;
        }
    }

    /// <summary>Loads the calibration settings file the request names, or null for none.</summary>
    /// <exception cref="InputException">The file is missing or not a settings file.</exception>
    public static CalibrationSettings? LoadSettings(ReportRequest request)
    {
        CalibrationSettings? settings = request.Settings is { } file ? CalibrationFile.Load(file.FullName) : null;
        return request.PickupWheel is { } wheel ? (settings ?? new CalibrationSettings()) with { PickupWheel = wheel } : settings;
    }

    /// <summary>The run with the settings applied (<see cref="CalibrationApplier"/>); as it is without settings.</summary>
    public static DecodedRun Calibrate(DecodedRun run, CalibrationSettings? settings) =>
        settings is null ? run : CalibrationApplier.Apply(run, settings);

    /// <summary>Opens every input the request names, with its calibration settings (if any) applied
    /// to every run; logs are read as their runs are enumerated.</summary>
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
            inputs.Add(new Input(run.Source, [Calibrate(run, settings)]));
            return inputs;
        }

        if (request.MetresPerPulse != null || request.PulsesPerRevolution != null || request.CircumferenceM != null)
        {
            throw new UsageException("--metres-per-pulse, --pulses-per-rev and --circumference-m are for plain-text inputs; a log carries its own");
        }

        // A plain-text table named as a log would be read as damaged frames ("no readable frames",
        // "the log ends inside a frame", "no runs"): say what it is and where it goes instead.
        if (request.Logs.FirstOrDefault(l => l.Extension.Equals(".csv", StringComparison.OrdinalIgnoreCase)) is { } table)
        {
            throw new UsageException($"{table.Name} is a plain-text table, not a log from the box: give it with --edges (t_s), --counts (t_lo_s,t_hi_s,count) or --accel (t_s,ax_mps2…)");
        }

        foreach (FileInfo log in request.Logs)
        {
            inputs.Add(new Input(log.FullName, settings, cancel));
        }

        return inputs;
    }
}
