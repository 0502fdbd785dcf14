using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using static LaunchLogger.Cli.Verbs.CalibrateSupport;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate teeth</c>: a tooth-spacing map of the pickup's ring from a
/// steady cruise.</summary>
public static class CalibrateTeethCommand
{
    private const string Verb = "teeth";

    private const int TeethPerLine = 6;

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var log = new Argument<FileInfo>("log") { Description = "Log of a steady cruise: light, constant throttle, no gear changes, steering or braking, 100 wheel revolutions or more." }.RejectingUnknownOptions();
        var run = new Option<string?>("--run") { Description = "Run N of the log (from 1, in log order)." };
        var settings = new Option<FileInfo?>("--settings") { Description = "Settings file to create or update (other settings in it are kept)." };
        var json = new Option<bool>("--json") { Description = "Write the result as JSON." };
        var command = new Command(
            "teeth",
            "Tooth-spacing map from a steady cruise: each tooth interval over the mean interval of its revolution, averaged per tooth. " +
            "Needs exact edge times, or a slow enough cruise for a polled counter. Saved for later use: report does not apply it to distances yet.")
        {
            log, run, settings, json,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new CalibrateTeethRequest
            {
                Log = parse.GetValue(log)!,
                Run = parse.GetValue(run),
                Settings = parse.GetValue(settings),
                Json = parse.GetValue(json),
            },
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(CalibrateTeethRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        return Guarded(Verb, error, () =>
        {
            CalibrationSettings? existing = LoadExisting(request.Settings);
            CalibrationLog log = ReadLog(request.Log, error, Verb, cancel);
            DecodedRun run = request.Run is null ? OnlyRun(log) : Select(log, request.Run, allowRange: false)[0];
            cancel.ThrowIfCancellationRequested();
            ToothSpacingMap map = ToothSpacingCalibration.Measure(run, log.Origins.OriginOf(run));
            foreach (string warning in map.Warnings)
            {
                error.WriteLine($"launchlogger calibrate {Verb}: {warning}");
            }

            CalibrationSettings? updated = existing is null ? null : existing with
            {
                ToothSpacing = map.Spacing.Select(s => Round(s, 6)).ToArray(),
                ToothSpacingSigma = map.Sigma.Select(s => Round(s, 6)).ToArray(),
            };
            SaveIfAsked(request.Settings, updated);
            if (request.Json)
            {
                WriteJson(map, request.Settings, output);
            }
            else
            {
                WriteText(map, output);
                SayWhatWasSaved(request.Settings, "tooth_spacing and tooth_spacing_sigma", output);
            }

            return map.Warnings.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
        });
    }

    private static void WriteText(ToothSpacingMap map, TextWriter output)
    {
        int n = map.PulsesPerRevolution;
        string numbering = map.IndexedByHardwareCount ? "hardware count" : "the run's own count";
        output.WriteLine($"Tooth-spacing map from {map.Source}: {F(map.Revolutions, "0")} steady revolutions at {F(map.MeanSpeedMps, "0.0")} m/s on average, edge brackets {F(map.MedianBracketS * 1e6, "0.#")} µs");
        output.WriteLine($"  relative gap length per tooth (tooth = {numbering} mod {n}; 1 = even spacing; ± 1 σ)");
        for (int start = 0; start < n; start += TeethPerLine)
        {
            var cells = Enumerable.Range(start, Math.Min(TeethPerLine, n - start))
                .Select(k => $"{k,3} {F(map.Spacing[k], "0.0000")}±{F(map.Sigma[k], "0.0000")}");
            output.WriteLine("  " + string.Join("  ", cells));
        }

        int worst = Enumerable.Range(0, n).MaxBy(k => Math.Abs(map.Spacing[k] - 1));
        output.WriteLine($"  spread: rms {F(map.RmsDeviation * 100, "0.00")} %, largest {Signed((map.Spacing[worst] - 1) * 100, "0.00")} % (tooth {worst}); typical σ {F(map.Sigma.Average() * 100, "0.000")} %");
        output.WriteLine($"  speeds from single intervals are off by up to {F(map.MaxDeviation * 100, "0.0")} % without the map. `report --settings` places each edge by it, once a run's steady revolutions show which tooth is which.");
    }

    private static void WriteJson(ToothSpacingMap map, FileInfo? settings, TextWriter output)
    {
        var document = new
        {
            Calibration = "tooth_spacing",
            map.Source,
            map.PulsesPerRevolution,
            ToothIndex = map.IndexedByHardwareCount ? "hardware_count_mod_pulses_per_revolution" : "run_count_mod_pulses_per_revolution",
            map.Spacing,
            map.Sigma,
            map.Revolutions,
            map.MeanSpeedMps,
            map.MedianBracketS,
            map.BracketNoiseFraction,
            map.RmsDeviation,
            map.MaxDeviation,
            // `report --settings` applies the map run by run, and only where the run's steady
            // revolutions show which tooth is which (each run's warnings say whether it was).
            AppliedByReport = "per_run_when_its_steady_revolutions_fix_the_turn",
            AlignmentRevolutionsPerTooth = ToothSpacingCalibration.MinimumAlignmentRevolutions,
            SavedTo = settings?.ToString(),
            map.Warnings,
        };
        output.WriteLine(JsonSerializer.Serialize(document, JsonOptions));
    }
}
