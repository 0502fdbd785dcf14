using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using static LaunchLogger.Cli.Verbs.CalibrateSupport;
using static System.FormattableString;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate accelerometer</c>: the forward axis' scale and offset from
/// two rests against gravity, the axis pointing up and then down.</summary>
public static class CalibrateAccelerometerCommand
{
    private const string Verb = "accelerometer";

    private const string Procedure =
        "Take the box out of the car (car parked, engine off). Stand it on its end on a still, firm surface with the forward axis pointing straight up, " +
        "square against a wall or a set square; when its light shows staged (steady), hold the mark button 3 s until the light blinks slowly, let go and stand clear: " +
        "the box records a 20-s bench rest by itself. Then stand it on its other end, forward axis pointing down, and record a second rest.";

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var rests = new Argument<FileInfo[]>("rest")
        {
            Description = "The rest with the forward axis pointing UP, then the one pointing DOWN: logs holding the box's bench rests, or accelerometer CSV files (t_s,ax_mps2[,ay_mps2,az_mps2]). " +
                "Or one log holding both bench rests, up first.",
            Arity = new ArgumentArity(1, 2),
        }.RejectingUnknownOptions();
        var rest = new Option<string[]>("--rest") { Description = "Bench rest N of a log (from 1, in log order, as report lists them), once per log when a log holds several; twice when one log holds both." };
        var run = new Option<string[]>("--run") { Description = "Take the rest from run N of a log instead (from 1, in log order; a run that holds a rest), once per log." };
        var latitude = new Option<double?>("--latitude") { Description = "Latitude of the place, degrees (north positive): gravity from the normal-gravity formula. Without it, standard gravity with the whole globe's spread (±0.15 %)." };
        var elevation = new Option<double>("--elevation") { Description = "Height above sea level, metres (with --latitude).", DefaultValueFactory = _ => 0 };
        var tilt = new Option<double>("--tilt-deg") { Description = "Largest tilt of the axis from the vertical in either rest, degrees.", DefaultValueFactory = _ => AccelerometerScaleCalibration.DefaultTiltDeg };
        var settings = new Option<FileInfo?>("--settings") { Description = "Settings file to create or update (other settings in it are kept)." };
        var json = new Option<bool>("--json") { Description = "Write the result as JSON." };
        var command = new Command(
            "accelerometer",
            "The accelerometer's forward scale and offset from two rests against gravity (axis up, then down), for report --settings: " +
            "with it, a standing start measures the tyre's rolling circumference by itself. " + Procedure)
        {
            rests, rest, run, latitude, elevation, tilt, settings, json,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new CalibrateAccelerometerRequest
            {
                Rests = parse.GetValue(rests) ?? [],
                Runs = parse.GetValue(run) ?? [],
                BenchRests = parse.GetValue(rest) ?? [],
                LatitudeDeg = parse.GetValue(latitude),
                ElevationM = parse.GetValue(elevation),
                TiltDeg = parse.GetValue(tilt),
                Settings = parse.GetValue(settings),
                Json = parse.GetValue(json),
            },
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(CalibrateAccelerometerRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(request);
        return Guarded(Verb, error, () =>
        {
            if (request.Rests.Count is < 1 or > 2)
            {
                throw new UsageException("give two records: the forward axis pointing up, then pointing down (or one log holding both bench rests)");
            }

            if (request.LatitudeDeg is { } lat && !(Math.Abs(lat) <= 90))
            {
                throw new UsageException("--latitude must be from -90 to 90 degrees");
            }

            if (!(request.TiltDeg >= 0 && request.TiltDeg <= 15))
            {
                throw new UsageException("--tilt-deg must be from 0 to 15 degrees");
            }

            if (!(Math.Abs(request.ElevationM) <= 9000))
            {
                throw new UsageException("--elevation must be within ±9000 m");
            }

            if (request.Runs.Count > request.Rests.Count)
            {
                throw new UsageException("give --run at most once per log");
            }

            if (request.Runs.Count > 0 && request.BenchRests.Count > 0)
            {
                throw new UsageException("give --rest or --run, not both");
            }

            if (request.BenchRests.Count > 2)
            {
                throw new UsageException("give --rest at most once per log (twice for one log holding both rests)");
            }

            if (request.Rests.Count == 1 && IsCsv(request.Rests[0]))
            {
                throw new UsageException($"{request.Rests[0].Name} is one accelerometer record, so one rest; the scale needs two, the forward axis pointing UP and then pointing DOWN. " +
                    "Record the other rest the same way (box on its other end, still, 20 s) and give both files, up first: launchlogger calibrate accelerometer UP.csv DOWN.csv");
            }

            CalibrationSettings? existing = LoadExisting(request.Settings);
            (Estimate up, string upName, Estimate down, string downName) = request.Rests.Count == 1
                ? ReadBothRests(request.Rests[0], request.BenchRests, error, cancel)
                : ReadTwoRests(request, error, cancel);
            AccelerometerScaleEstimate result = AccelerometerScaleCalibration.FromRests(up, down, AccelerometerScaleCalibration.LocalGravity(request.LatitudeDeg, request.ElevationM), request.TiltDeg);
            foreach (string warning in result.Warnings)
            {
                error.WriteLine($"launchlogger calibrate {Verb}: {warning}");
            }

            CalibrationSettings? updated = existing is null ? null : existing with
            {
                AccelForwardScale = Round(result.Scale.Value, 6),
                AccelForwardScaleSigma = Round(result.Scale.Sigma, 6),
                AccelForwardBiasMps2 = Round(result.BiasMps2.Value, 5),
                AccelForwardBiasSigmaMps2 = Round(result.BiasMps2.Sigma, 5),
            };
            SaveIfAsked(request.Settings, updated);
            if (request.Json)
            {
                var document = new
                {
                    Calibration = "accelerometer_forward_axis",
                    Scale = result.Scale.Value,
                    ScaleSigma = result.Scale.Sigma,
                    BiasMps2 = result.BiasMps2.Value,
                    BiasSigmaMps2 = result.BiasMps2.Sigma,
                    GravityMps2 = result.GravityMps2.Value,
                    GravitySigmaMps2 = result.GravityMps2.Sigma,
                    result.TiltDeg,
                    UpMps2 = result.UpMps2.Value,
                    UpSigmaMps2 = result.UpMps2.Sigma,
                    DownMps2 = result.DownMps2.Value,
                    DownSigmaMps2 = result.DownMps2.Sigma,
                    SavedTo = request.Settings?.ToString(),
                    result.Warnings,
                };
                output.WriteLine(JsonSerializer.Serialize(document, JsonOptions));
            }
            else
            {
                output.WriteLine("Accelerometer forward axis against gravity (axis up, then down)");
                output.WriteLine($"  up      {F(up.Value, "0.0000")} ± {F(up.Sigma, "0.0000")} m/s²   ({upName})");
                output.WriteLine($"  down    {F(down.Value, "0.0000")} ± {F(down.Sigma, "0.0000")} m/s²   ({downName})");
                output.WriteLine($"  gravity {F(result.GravityMps2.Value, "0.0000")} ± {F(result.GravityMps2.Sigma, "0.0000")} m/s² ({(request.LatitudeDeg is null ? "standard; give --latitude for the local value" : "normal gravity at the latitude given")}); tilt up to {F(result.TiltDeg, "0.0")}° allowed");
                output.WriteLine($"  scale   {F(result.Scale.Value, "0.00000")} ± {F(result.Scale.Sigma, "0.00000")} (reads {Signed((result.Scale.Value - 1) * 100, "0.000")} % ± {F(result.Scale.Sigma * 100, "0.000")} %)");
                output.WriteLine($"  offset  {Signed(result.BiasMps2.Value, "0.0000")} ± {F(result.BiasMps2.Sigma, "0.0000")} m/s² (shown; each run takes its own resting level at staging)");
                SayWhatWasSaved(request.Settings, "accel_forward_scale and accel_forward_bias_mps2", output);
            }

            return result.Warnings.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
        });
    }

    /// <summary>The two rests from two files: CSV, a log's bench rest, or a log's run.</summary>
    private static (Estimate Up, string UpName, Estimate Down, string DownName) ReadTwoRests(CalibrateAccelerometerRequest request, TextWriter error, CancellationToken cancel)
    {
        string? Pick(IReadOnlyList<string> specs, int i) => specs.Count > i ? specs[i] : null;
        (Estimate up, string upName) = ReadRest(request.Rests[0], Pick(request.Runs, 0), Pick(request.BenchRests, 0), error, cancel);
        (Estimate down, string downName) = ReadRest(request.Rests[1], Pick(request.Runs, 1), Pick(request.BenchRests, 1), error, cancel);
        return (up, upName, down, downName);
    }

    /// <summary>Both rests from one log: the two named with <c>--rest</c>, or its only two.</summary>
    private static (Estimate Up, string UpName, Estimate Down, string DownName) ReadBothRests(FileInfo file, IReadOnlyList<string> specs, TextWriter error, CancellationToken cancel)
    {
        CalibrationLog log = ReadLog(file, error, Verb, cancel, requireRuns: false);
        BenchRestRecord up;
        BenchRestRecord down;
        if (specs.Count == 2)
        {
            up = SelectRest(log, specs[0]);
            down = SelectRest(log, specs[1]);
        }
        else if (specs.Count == 0 && log.BenchRests.Count == 2)
        {
            up = log.BenchRests[0];
            down = log.BenchRests[1];
        }
        else if (log.BenchRests.Count < 2)
        {
            throw new UsageException($"{file.Name} holds {log.BenchRests.Count} bench rest(s); the scale needs two, the forward axis pointing UP and then pointing DOWN. " +
                "Record the missing rest(s) with the mark button (see launchlogger calibrate accelerometer --help) and give this log again, or give two files, up first");
        }
        else
        {
            throw new UsageException($"{file.Name} holds {log.BenchRests.Count} bench rest(s); give the two to use as --rest UP --rest DOWN (1-{log.BenchRests.Count}, in log order)");
        }

        return (RestLevel(up, error), up.Source, RestLevel(down, error), down.Source);
    }

    /// <summary>The mean forward reading of one rest: a CSV file's samples, a log's bench rest, or
    /// a log run's samples.</summary>
    private static (Estimate Level, string Name) ReadRest(FileInfo file, string? runSpec, string? restSpec, TextWriter error, CancellationToken cancel)
    {
        cancel.ThrowIfCancellationRequested();
        AccelSeries? series;
        if (IsCsv(file))
        {
            series = AccelFile.Read(file.FullName);
        }
        else
        {
            CalibrationLog log = ReadLog(file, error, Verb, cancel, requireRuns: false);
            if (runSpec is null && (restSpec is not null || log.BenchRests.Count > 0))
            {
                BenchRestRecord rest = restSpec is null ? OnlyRest(log) : SelectRest(log, restSpec);
                return (RestLevel(rest, error), rest.Source);
            }

            if (log.Runs.Count == 0)
            {
                throw new InputException(file.ToString(), 0, "no bench rests and no runs in this log (is it a LaunchLogger log?)");
            }

            DecodedRun run = runSpec is null ? OnlyRun(log) : Select(log, runSpec, allowRange: false)[0];
            series = run.Accel;
        }

        if (series is null || series.Count == 0)
        {
            throw new CalibrationException($"{file}: no accelerometer samples");
        }

        return (AccelerometerScaleCalibration.RestLevel(series.TimeS, series.ForwardMps2, file.ToString()), file.Name);
    }

    /// <summary>Whether a rest is given as an accelerometer CSV file (by its extension) rather than a log.</summary>
    private static bool IsCsv(FileInfo file) => file.Extension.Equals(".csv", StringComparison.OrdinalIgnoreCase);

    /// <summary>The log's only bench rest.</summary>
    private static BenchRestRecord OnlyRest(CalibrationLog log)
    {
        if (log.BenchRests.Count == 1)
        {
            return log.BenchRests[0];
        }

        throw new UsageException($"{Path.GetFileName(log.Path)} holds {log.BenchRests.Count} bench rests; choose one with --rest N (1-{log.BenchRests.Count}, in log order)");
    }

    /// <summary>The bench rest a <c>--rest</c> value names.</summary>
    private static BenchRestRecord SelectRest(CalibrationLog log, string spec)
    {
        if (!int.TryParse(spec.Trim(), System.Globalization.NumberStyles.None, Inv, out int n) || n < 1)
        {
            throw new UsageException($"--rest {spec}: give a bench rest number from 1");
        }

        if (n > log.BenchRests.Count)
        {
            throw new UsageException($"--rest {spec}: {Path.GetFileName(log.Path)} holds {log.BenchRests.Count} bench rest(s)");
        }

        return log.BenchRests[n - 1];
    }

    /// <summary>The mean forward reading of a bench rest; a spoiled one is refused.</summary>
    /// <exception cref="CalibrationException">The car moved during it, or it is too short or not still.</exception>
    private static Estimate RestLevel(BenchRestRecord rest, TextWriter error)
    {
        if (rest.Outcome == BenchRestOutcome.SpoiledByPulse)
        {
            throw new CalibrationException(Invariant($"{rest.Source}: a wheel pulse came {rest.EndedS - rest.OpenedS:0.0} s into the rest (the car or the wheel moved), so it is no rest; record it again with the box out of the car, the car parked and the engine off"));
        }

        foreach (string warning in rest.Warnings)
        {
            error.WriteLine($"launchlogger calibrate {Verb}: {rest.Source}: {warning}");
        }

        if (rest.Outcome != BenchRestOutcome.Complete)
        {
            error.WriteLine(Invariant($"launchlogger calibrate {Verb}: {rest.Source}: shorter than its set {rest.LengthS:0} s ({(rest.Outcome == BenchRestOutcome.CutShort ? "the box shut down" : "its end is missing")}); its samples are used"));
        }

        (double[] time, double[] forward) = rest.Forward();
        return AccelerometerScaleCalibration.RestLevel(time, forward, rest.Source);
    }
}
