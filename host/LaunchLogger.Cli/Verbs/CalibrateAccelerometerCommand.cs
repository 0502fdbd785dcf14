using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using static LaunchLogger.Cli.Verbs.CalibrateSupport;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate accelerometer</c>: the forward axis' scale and offset from
/// two rests against gravity, the axis pointing up and then down.</summary>
public static class CalibrateAccelerometerCommand
{
    private const string Verb = "accelerometer";

    private const string Procedure =
        "Take the box out of the car (engine off, parked). Stand it on its end on a still, firm surface with the forward axis pointing straight up, " +
        "square against a wall or a set square; record 10-30 s untouched. Then stand it on its other end, forward axis pointing down, and record again.";

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var rests = new Argument<FileInfo[]>("rest")
        {
            Description = "Two records, in this order: the forward axis pointing UP, then pointing DOWN. Accelerometer CSV files (t_s,ax_mps2[,ay_mps2,az_mps2]), or logs whose run holds the rest (the box does not record a rest by itself yet).",
            Arity = new ArgumentArity(2, 2),
        }.RejectingUnknownOptions();
        var run = new Option<string[]>("--run") { Description = "Run N of a log (from 1, in log order), once per log when a log holds several runs." };
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
            rests, run, latitude, elevation, tilt, settings, json,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new CalibrateAccelerometerRequest
            {
                Rests = parse.GetValue(rests) ?? [],
                Runs = parse.GetValue(run) ?? [],
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
            if (request.Rests.Count != 2)
            {
                throw new UsageException("give two records: the forward axis pointing up, then pointing down");
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

            if (request.Runs.Count > 2)
            {
                throw new UsageException("give --run at most once per log");
            }

            CalibrationSettings? existing = LoadExisting(request.Settings);
            Estimate up = ReadRest(request.Rests[0], request.Runs.Count > 0 ? request.Runs[0] : null, error, cancel);
            Estimate down = ReadRest(request.Rests[1], request.Runs.Count > 1 ? request.Runs[1] : null, error, cancel);
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
                output.WriteLine($"  up      {F(up.Value, "0.0000")} ± {F(up.Sigma, "0.0000")} m/s²   ({request.Rests[0].Name})");
                output.WriteLine($"  down    {F(down.Value, "0.0000")} ± {F(down.Sigma, "0.0000")} m/s²   ({request.Rests[1].Name})");
                output.WriteLine($"  gravity {F(result.GravityMps2.Value, "0.0000")} ± {F(result.GravityMps2.Sigma, "0.0000")} m/s² ({(request.LatitudeDeg is null ? "standard; give --latitude for the local value" : "normal gravity at the latitude given")}); tilt up to {F(result.TiltDeg, "0.0")}° allowed");
                output.WriteLine($"  scale   {F(result.Scale.Value, "0.00000")} ± {F(result.Scale.Sigma, "0.00000")} (reads {Signed((result.Scale.Value - 1) * 100, "0.000")} % ± {F(result.Scale.Sigma * 100, "0.000")} %)");
                output.WriteLine($"  offset  {Signed(result.BiasMps2.Value, "0.0000")} ± {F(result.BiasMps2.Sigma, "0.0000")} m/s² (shown; each run takes its own resting level at staging)");
                SayWhatWasSaved(request.Settings, "accel_forward_scale and accel_forward_bias_mps2", output);
            }

            return result.Warnings.Count == 0 ? ExitCode.Ok : ExitCode.Partial;
        });
    }

    /// <summary>The mean forward reading of one rest: a CSV file's samples, or a log run's.</summary>
    private static Estimate ReadRest(FileInfo file, string? runSpec, TextWriter error, CancellationToken cancel)
    {
        cancel.ThrowIfCancellationRequested();
        AccelSeries? series;
        if (file.Extension.Equals(".csv", StringComparison.OrdinalIgnoreCase))
        {
            series = AccelFile.Read(file.FullName);
        }
        else
        {
            CalibrationLog log = ReadLog(file, error, Verb, cancel);
            DecodedRun run = runSpec is null ? OnlyRun(log) : Select(log, runSpec, allowRange: false)[0];
            series = run.Accel;
        }

        if (series is null || series.Count == 0)
        {
            throw new CalibrationException($"{file}: no accelerometer samples");
        }

        return AccelerometerScaleCalibration.RestLevel(series.TimeS, series.ForwardMps2, file.ToString());
    }
}
