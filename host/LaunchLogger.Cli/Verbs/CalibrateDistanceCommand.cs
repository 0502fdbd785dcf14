using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using static LaunchLogger.Cli.Verbs.CalibrateSupport;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate distance</c>: the rolling circumference from a roll over a
/// taped distance, with its uncertainty and the change against the log's configured value.</summary>
public static class CalibrateDistanceCommand
{
    private const string Verb = "distance";

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var log = new Argument<FileInfo>("log") { Description = "Log of the roll(s): from a standstill on the start line to a standstill on the end line." }.RejectingUnknownOptions();
        var metres = new Option<double>("--metres") { Description = "Taped distance between the start and end lines, m.", Required = true };
        var tape = new Option<double>("--tape-uncertainty-m") { Description = "1-σ uncertainty of that distance, m, lining up at both ends included.", DefaultValueFactory = _ => 0.05 };
        var run = new Option<string[]>("--run")
        {
            Description = "Run N of the log (from 1, in log order), or N-M for runs joined into one roll (stopped short, then crept to the line). Repeat for repeated rolls; they are averaged.",
            AllowMultipleArgumentsPerToken = false,
        };
        var settings = new Option<FileInfo?>("--settings") { Description = "Settings file to create or update (other settings in it are kept)." };
        var json = new Option<bool>("--json") { Description = "Write the result as JSON." };
        var command = new Command("distance", "Rolling circumference from a roll over a taped distance: circumference = distance × pulses per revolution / counted pulses.")
        {
            log, metres, tape, run, settings, json,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new CalibrateDistanceRequest
            {
                Log = parse.GetValue(log)!,
                Metres = parse.GetValue(metres),
                TapeUncertaintyM = parse.GetValue(tape),
                Runs = parse.GetValue(run) ?? [],
                Settings = parse.GetValue(settings),
                Json = parse.GetValue(json),
            },
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(CalibrateDistanceRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        return Guarded(Verb, error, () =>
        {
            if (!(request.Metres >= 1 && request.Metres <= 100_000))
            {
                throw new UsageException("--metres must be the taped distance, from 1 to 100000 m");
            }

            if (!(request.TapeUncertaintyM >= 0 && request.TapeUncertaintyM < request.Metres / 10))
            {
                throw new UsageException("--tape-uncertainty-m must be 0 or more and under a tenth of the distance");
            }

            CalibrationSettings? existing = LoadExisting(request.Settings);
            CalibrationLog log = ReadLog(request.Log, error, Verb, cancel);
            List<IReadOnlyList<DecodedRun>> rolls = request.Runs.Count == 0
                ? [[DefaultRun(log)]]
                : request.Runs.Select(spec => Select(log, spec, allowRange: true)).ToList();
            cancel.ThrowIfCancellationRequested();
            List<RollMeasurement> measured = rolls.Select(r => DistanceCalibration.CountRoll(r, log.Origins)).ToList();
            CircumferenceCalibration result = DistanceCalibration.Compute(measured, request.Metres, request.TapeUncertaintyM);
            foreach (string warning in result.Warnings)
            {
                error.WriteLine($"launchlogger calibrate {Verb}: {warning}");
            }

            CalibrationSettings? updated = existing is null ? null : existing with
            {
                CircumferenceM = Round(result.CircumferenceM, 6),
                CircumferenceSigmaM = Round(result.SigmaM, 6),
            };
            SaveIfAsked(request.Settings, updated);
            if (request.Json)
            {
                WriteJson(result, request.Settings, output);
            }
            else
            {
                WriteText(result, output);
                SayWhatWasSaved(request.Settings, "circumference_m and circumference_sigma_m", output);
            }

            return result.Warnings.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
        });
    }

    /// <summary>The log's only run; with several, the message lists what each counted so the
    /// user can pick the rolls.</summary>
    private static DecodedRun DefaultRun(CalibrationLog log)
    {
        if (log.Runs.Count == 1)
        {
            return log.Runs[0];
        }

        string list = string.Join(", ", log.Runs.Select((r, i) => $"{i + 1}: {(r.Pulses.Count == 0 ? 0 : r.Pulses[^1].Count)} pulses"));
        throw new UsageException($"{Path.GetFileName(log.Path)} holds {log.Runs.Count} runs ({list}); choose the rolls with --run N (repeat for repeats, N-M to join runs)");
    }

    private static void WriteText(CircumferenceCalibration r, TextWriter output)
    {
        output.WriteLine("Rolling circumference from a measured roll (distance × pulses per revolution / counted pulses)");
        foreach (RollMeasurement roll in r.Rolls)
        {
            output.WriteLine($"  {roll.Source}: {roll.Pulses} pulses → {F(r.DistanceM * roll.PulsesPerRevolution / roll.Pulses, "0.00000")} m");
        }

        if (r.Rolls.Count > 1)
        {
            output.WriteLine($"  {r.Rolls.Count} rolls, mean {F(r.MeanPulses, "0.0")} pulses, spread {F(r.SpreadFraction * 100, "0.000")} %");
        }

        output.WriteLine($"  taped distance         {F(r.DistanceM, "0.000")} m ± {F(r.TapeSigmaM, "0.000")} m (1 σ, as stated)");
        output.WriteLine($"  pulses per revolution  {r.PulsesPerRevolution}");
        output.WriteLine($"  rolling circumference  {F(r.CircumferenceM, "0.00000")} m ± {F(r.SigmaM, "0.00000")} m (1 σ; counting ±{F(r.CountingSigmaM, "0.00000")} m, tape ±{F(r.TapeSigmaPartM, "0.00000")} m)");
        output.WriteLine($"  distance per pulse     {F(r.MetresPerPulse * 1000, "0.000")} mm");
        output.WriteLine($"  configured in the log  {F(r.ConfiguredCircumferenceM, "0.00000")} m → change {Signed(r.ChangeFraction * 100, "0.00")} % ({Signed(r.ChangeM * 1000, "0.0")} mm)");
        output.WriteLine($"  for the box's configuration: {F(Math.Round(r.CircumferenceM * 1e6), "0")} µm");
    }

    private static void WriteJson(CircumferenceCalibration r, FileInfo? settings, TextWriter output)
    {
        var document = new
        {
            Calibration = "rolling_circumference",
            r.DistanceM,
            r.TapeSigmaM,
            Rolls = r.Rolls.Select(x => new { x.Source, x.Pulses }).ToArray(),
            r.MeanPulses,
            r.PulsesPerRevolution,
            r.CircumferenceM,
            CircumferenceSigmaM = r.SigmaM,
            r.CountingSigmaM,
            TapeSigmaPartM = r.TapeSigmaPartM,
            r.MetresPerPulse,
            r.ConfiguredCircumferenceM,
            ChangePercent = r.ChangeFraction * 100,
            ChangeMm = r.ChangeM * 1000,
            r.SpreadFraction,
            SavedTo = settings?.ToString(),
            r.Warnings,
        };
        output.WriteLine(JsonSerializer.Serialize(document, JsonOptions));
    }
}
