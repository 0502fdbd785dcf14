using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using static LaunchLogger.Cli.Verbs.CalibrateSupport;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate mounting</c>: the accelerometer's pitch and yaw in the car
/// from a rest and a straight acceleration on level ground, or mounting and slope separated by two
/// rests on one spot facing opposite ways.</summary>
public static class CalibrateMountingCommand
{
    private const string Verb = "mounting";

    private const string LevelBanner =
        "ASSUMES LEVEL GROUND: any slope along the car is read as mounting pitch (each 1 % of slope adds 0.57°). " +
        "Where the ground may slope, rest facing both ways on one spot instead: launchlogger calibrate mounting LOG_A LOG_B.";

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var logs = new Argument<FileInfo[]>("log")
        {
            Description = "One log: a staged rest then a firm, straight acceleration, ON LEVEL GROUND. Two logs (or one log with two --run): rests on one spot facing opposite ways, which also measures the spot's slope.",
            Arity = new ArgumentArity(1, 2),
        }.RejectingUnknownOptions();
        var run = new Option<string[]>("--run")
        {
            Description = "Run N of the log (from 1, in log order); give it once per rest (twice with one log for the two-way rests).",
            AllowMultipleArgumentsPerToken = false,
        };
        var settings = new Option<FileInfo?>("--settings") { Description = "Settings file to create or update (other settings in it are kept)." };
        var json = new Option<bool>("--json") { Description = "Write the result as JSON." };
        var command = new Command(
            "mounting",
            "Accelerometer mounting: pitch (the forward axis' offset included) from a rest and yaw from a straight acceleration. " +
            "With ONE rest the ground MUST BE LEVEL; with two rests on one spot facing opposite ways the slope is measured and removed.")
        {
            logs, run, settings, json,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new CalibrateMountingRequest
            {
                Logs = parse.GetValue(logs) ?? [],
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
    public static ExitCode Run(CalibrateMountingRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        return Guarded(Verb, error, () =>
        {
            CalibrationSettings? existing = LoadExisting(request.Settings);
            List<DecodedRun> rests = PickRests(request, error, cancel);
            cancel.ThrowIfCancellationRequested();
            MountingEstimate result = rests.Count == 1
                ? MountingCalibration.FromLevelRest(rests[0])
                : MountingCalibration.FromOppositeRests(rests[0], rests[1]);
            foreach (string warning in result.Warnings)
            {
                error.WriteLine($"launchlogger calibrate {Verb}: {warning}");
            }

            CalibrationSettings? updated = existing is null ? null : existing with
            {
                MountingPitchDeg = Round(Deg(result.PitchRad.Value), 4),
                MountingPitchSigmaDeg = Round(Deg(result.PitchRad.Sigma), 4),
                MountingYawDeg = result.YawRad is { } y ? Round(Deg(y.Value), 4) : existing.MountingYawDeg,
                MountingYawSigmaDeg = result.YawRad is { } ys ? Round(Deg(ys.Sigma), 4) : existing.MountingYawSigmaDeg,
            };
            SaveIfAsked(request.Settings, updated);
            if (request.Json)
            {
                if (!result.TwoWay)
                {
                    error.WriteLine($"launchlogger calibrate {Verb}: {LevelBanner}");
                }

                WriteJson(result, request.Settings, output);
            }
            else
            {
                WriteText(result, output);
                SayWhatWasSaved(request.Settings, result.YawRad is null ? "mounting_pitch_deg (the yaw was not measured and is left as it was)" : "mounting_pitch_deg and mounting_yaw_deg", output);
            }

            return result.Warnings.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
        });
    }

    private static List<DecodedRun> PickRests(CalibrateMountingRequest request, TextWriter error, CancellationToken cancel)
    {
        int logs = request.Logs.Count;
        int runs = request.Runs.Count;
        if (logs is < 1 or > 2)
        {
            throw new UsageException("give one log (one rest on level ground) or two logs (rests facing opposite ways)");
        }

        if (runs > 2 || (logs == 2 && runs == 1))
        {
            throw new UsageException(logs == 2 ? "with two logs, give --run twice (one per log) or not at all" : "give --run at most twice (two rests)");
        }

        List<CalibrationLog> read = request.Logs.Select(f => ReadLog(f, error, Verb, cancel)).ToList();
        if (logs == 2)
        {
            return runs == 0
                ? [OnlyRun(read[0]), OnlyRun(read[1])]
                : [Select(read[0], request.Runs[0], allowRange: false)[0], Select(read[1], request.Runs[1], allowRange: false)[0]];
        }

        return runs switch
        {
            0 => [OnlyRun(read[0])],
            1 => [Select(read[0], request.Runs[0], allowRange: false)[0]],
            _ => [Select(read[0], request.Runs[0], allowRange: false)[0], Select(read[0], request.Runs[1], allowRange: false)[0]],
        };
    }

    private static void WriteText(MountingEstimate r, TextWriter output)
    {
        if (!r.TwoWay)
        {
            output.WriteLine(LevelBanner);
            output.WriteLine($"Accelerometer mounting from {r.Rests[0].Source}");
        }
        else
        {
            output.WriteLine("Accelerometer mounting from two rests on one spot facing opposite ways (mounting = mean, slope = half the difference)");
        }

        char label = 'A';
        foreach (RestReading rest in r.Rests)
        {
            string name = r.TwoWay ? $"rest {label++}" : "rest";
            output.WriteLine($"  {name,-7} {rest.Source}: {F(rest.DurationS, "0.00")} s, {rest.Samples} samples before first motion; pitch {Angle(rest.PitchRad, "0.000")}, roll {Angle(rest.RollRad, "0.00")}");
        }

        output.WriteLine($"  pitch   {Angle(r.PitchRad, "0.000")} (nose up; the forward axis' offset included as an equivalent angle)");
        output.WriteLine($"  roll    {Angle(r.RollRad, "0.00")} (left side up; shown, not saved)");
        if (r.YawRad is { } yaw)
        {
            string from = string.Join(" and ", r.Yaws.Select(y => $"{y.Samples} samples ({F(y.DurationS, "0.0")} s) above {F(MountingCalibration.FirmAccelerationMps2, "0.0")} m/s²"));
            output.WriteLine($"  yaw     {Angle(yaw, "0.00")} (forward axis turned to the left) from {from}");
        }
        else
        {
            output.WriteLine("  yaw     not measured: no firm, straight acceleration after the rest");
        }

        if (r.GradeRad is { } grade && r.GradePercent is { } percent)
        {
            double sigmaPercent = grade.Sigma / (Math.Cos(grade.Value) * Math.Cos(grade.Value)) * 100;
            string direction = grade.Value >= 0 ? "uphill" : "downhill";
            output.WriteLine($"  the spot slopes {Signed(percent, "0.00")} % ± {F(sigmaPercent, "0.00")} % ({Angle(grade, "0.000")}) along the car: {direction} in the direction rest A faced");
        }

        if (r.CrossSlopeRad is { } cross)
        {
            output.WriteLine($"  cross slope {Signed(Math.Tan(cross.Value) * 100, "0.00")} % (left side up for rest A)");
        }
    }

    private static string Angle(Estimate e, string format) => $"{Signed(Deg(e.Value), format)}° ± {F(Deg(e.Sigma), format)}°";

    private static void WriteJson(MountingEstimate r, FileInfo? settings, TextWriter output)
    {
        var document = new
        {
            Calibration = "accelerometer_mounting",
            r.TwoWay,
            LevelGroundAssumed = !r.TwoWay,
            Note = r.TwoWay ? null : LevelBanner,
            PitchDeg = Deg(r.PitchRad.Value),
            PitchSigmaDeg = Deg(r.PitchRad.Sigma),
            RollDeg = Deg(r.RollRad.Value),
            RollSigmaDeg = Deg(r.RollRad.Sigma),
            YawDeg = r.YawRad is { } y ? Deg(y.Value) : (double?)null,
            YawSigmaDeg = r.YawRad is { } ys ? Deg(ys.Sigma) : (double?)null,
            GradePercent = r.GradePercent,
            GradeDeg = r.GradeRad is { } g ? Deg(g.Value) : (double?)null,
            GradeSigmaDeg = r.GradeRad is { } gs ? Deg(gs.Sigma) : (double?)null,
            CrossSlopePercent = r.CrossSlopeRad is { } c ? Math.Tan(c.Value) * 100 : (double?)null,
            Rests = r.Rests.Select(x => new { x.Source, x.Samples, x.DurationS, PitchDeg = Deg(x.PitchRad.Value), PitchSigmaDeg = Deg(x.PitchRad.Sigma), RollDeg = Deg(x.RollRad.Value) }).ToArray(),
            Yaws = r.Yaws.Select(x => new { x.Source, x.Samples, x.DurationS, YawDeg = Deg(x.YawRad.Value), YawSigmaDeg = Deg(x.YawRad.Sigma) }).ToArray(),
            SavedTo = settings?.ToString(),
            r.Warnings,
        };
        output.WriteLine(JsonSerializer.Serialize(document, JsonOptions));
    }
}
