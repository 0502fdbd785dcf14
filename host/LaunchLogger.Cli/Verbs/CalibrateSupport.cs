using System.Globalization;
using System.Text.Json;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Verbs;

/// <summary>What the <c>calibrate</c> verbs share: reading logs, choosing runs, merging the
/// settings file, numbers for people and for JSON.</summary>
internal static class CalibrateSupport
{
    /// <summary>JSON output: snake_case names, indented.</summary>
    public static JsonSerializerOptions JsonOptions { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        WriteIndented = true,
    };

    /// <summary>Invariant culture for every number printed.</summary>
    public static CultureInfo Inv => CultureInfo.InvariantCulture;

    /// <summary>Reads a log, passing its warnings on, and checks it holds runs (unless
    /// <paramref name="requireRuns"/> is false: a log of bench rests only).</summary>
    /// <exception cref="InputException">Missing, unreadable, or without runs when they are required.</exception>
    public static CalibrationLog ReadLog(FileInfo file, TextWriter error, string verb, CancellationToken cancel, bool requireRuns = true)
    {
        CalibrationLog log = CalibrationLog.Read(file.FullName, cancel);
        foreach (string warning in log.Result.Warnings)
        {
            error.WriteLine($"launchlogger calibrate {verb}: {file.Name}: {warning}");
        }

        if (requireRuns && log.Runs.Count == 0)
        {
            throw new InputException(file.ToString(), 0, "no runs in this log (is it a LaunchLogger log?)");
        }

        return log;
    }

    /// <summary>The runs a <c>--run</c> value names: "N" for the Nth run of the log (from 1, in
    /// log order) or "N-M" for runs N to M joined.</summary>
    /// <exception cref="UsageException">Not a run number or range of this log.</exception>
    public static IReadOnlyList<DecodedRun> Select(CalibrationLog log, string spec, bool allowRange)
    {
        string text = spec.Trim();
        int dash = text.IndexOf('-', 1);
        string firstText = dash > 0 ? text[..dash] : text;
        string lastText = dash > 0 ? text[(dash + 1)..] : text;
        if (dash > 0 && !allowRange)
        {
            throw new UsageException($"--run {spec}: give one run number here, not a range");
        }

        if (!int.TryParse(firstText, NumberStyles.None, Inv, out int first) || !int.TryParse(lastText, NumberStyles.None, Inv, out int last)
            || first < 1 || last < first)
        {
            throw new UsageException($"--run {spec}: give a run number from 1{(allowRange ? ", or a range like 2-3" : "")}");
        }

        if (last > log.Runs.Count)
        {
            throw new UsageException($"--run {spec}: {Path.GetFileName(log.Path)} holds {log.Runs.Count} run(s)");
        }

        return log.Runs.Skip(first - 1).Take(last - first + 1).ToList();
    }

    /// <summary>The log's only run.</summary>
    /// <exception cref="UsageException">The log holds several runs.</exception>
    public static DecodedRun OnlyRun(CalibrationLog log)
    {
        if (log.Runs.Count == 1)
        {
            return log.Runs[0];
        }

        throw new UsageException($"{Path.GetFileName(log.Path)} holds {log.Runs.Count} runs; choose one with --run N (1-{log.Runs.Count}, in log order)");
    }

    /// <summary>Loads the settings file to update, if one was named, before any work is done.</summary>
    /// <exception cref="InputException">The file exists but cannot be used.</exception>
    public static CalibrationSettings? LoadExisting(FileInfo? settings) =>
        settings is null ? null : CalibrationFile.LoadOrEmpty(settings.FullName);

    /// <summary>Writes the merged settings when a settings file was named.</summary>
    /// <exception cref="InputException">The file could not be written.</exception>
    public static void SaveIfAsked(FileInfo? file, CalibrationSettings? updated)
    {
        if (file != null && updated != null)
        {
            CalibrationFile.Save(file.FullName, updated);
        }
    }

    /// <summary>Tells the user what was saved, or how to save it.</summary>
    public static void SayWhatWasSaved(FileInfo? file, string fields, TextWriter output)
    {
        output.WriteLine(file is null
            ? "Not saved: add --settings FILE to keep it for `launchlogger report --settings FILE`."
            : $"Saved {fields} to {file} (other settings kept).");
    }

    /// <summary>Rounds for the settings file: enough digits, no noise.</summary>
    public static double Round(double value, int digits) => Math.Round(value, digits, MidpointRounding.AwayFromZero);

    /// <summary>Radians to degrees.</summary>
    public static double Deg(double radians) => radians * 180 / Math.PI;

    /// <summary>Formats with a sign and the invariant culture.</summary>
    public static string Signed(double value, string format) => value.ToString("+" + format + ";-" + format + ";" + format, Inv);

    /// <summary>Formats with the invariant culture.</summary>
    public static string F(double value, string format) => value.ToString(format, Inv);

    /// <summary>Runs a calibration verb's body and turns its failures into one line on
    /// <paramref name="error"/> and the matching exit code.</summary>
    public static ExitCode Guarded(string verb, TextWriter error, Func<ExitCode> body)
    {
        try
        {
            return body();
        }
        catch (UsageException e)
        {
            error.WriteLine($"launchlogger calibrate {verb}: {e.Message}");
            return ExitCode.Usage;
        }
        catch (Exception e) when (e is InputException or CalibrationException)
        {
            error.WriteLine($"launchlogger calibrate {verb}: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (OperationCanceledException)
        {
            error.WriteLine($"launchlogger calibrate {verb}: cancelled; nothing written");
            return ExitCode.Cancelled;
        }
    }
}
