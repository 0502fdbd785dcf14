using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Serialization;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Simulation.Truth;

/// <summary>Writes a simulation's truth as indented JSON: snake_case names, SI units (s, m, m/s,
/// m/s²), times in seconds on the box's clock.</summary>
/// <remarks>Sections: <c>events</c> (true moments), <c>figures</c> (the true figures under both
/// conventions, from the shared figure calculator), <c>sensors</c> (what the sensors really were),
/// <c>box</c> (what the firmware itself concluded, and its health counters),
/// <c>series_summary</c>, and <c>series</c>: the true trajectory resampled every
/// <c>series.step_s</c>.</remarks>
public static class TruthJson
{
    /// <summary>Step of the written series, s.</summary>
    public const double SeriesStepS = 0.01;

    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        WriteIndented = true,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower), new RoundingConverter() },
    };

    /// <summary>The truth as a JSON string.</summary>
    public static string ToJson(SimulationResult result)
    {
        ArgumentNullException.ThrowIfNull(result);
        return JsonSerializer.Serialize(Document(result), Options);
    }

    /// <summary>Writes the truth to <paramref name="stream"/> (UTF-8).</summary>
    public static void Write(SimulationResult result, Stream stream)
    {
        ArgumentNullException.ThrowIfNull(result);
        JsonSerializer.Serialize(stream, Document(result), Options);
    }

    private static object Document(SimulationResult result)
    {
        Trajectory t = result.Truth;
        return new
        {
            Scenario = result.Scenario.Name,
            result.Scenario.Description,
            result.Seed,
            TimeAxis = "seconds on the box's clock (the log's microseconds / 1e6)",
            DurationS = result.DurationS,
            result.Events,
            Figures = result.Figures is { } f ? Figures(f) : null,
            result.Sensors,
            Box = new
            {
                Runs = result.BoxRuns,
                FirstMotionS = result.BoxFirstMotionS,
                RolloutS = result.BoxRolloutS,
                LogBytes = result.LogBytes.Length,
                Health = Health(result.Health),
            },
            Environment = new
            {
                result.Scenario.Environment.GradePercent,
                GradeRad = Math.Atan(result.Scenario.Environment.GradePercent / 100),
                result.Scenario.Environment.HeadwindMps,
                result.Scenario.Environment.AirDensityKgM3,
            },
            SeriesSummary = new
            {
                Samples = t.Count,
                StartS = t.TimeS[0],
                EndS = t.TimeS[^1],
                GridStepS = Simulator.TruthGridS,
                MaxSpeedMps = t.SpeedMps.Max(),
                MaxAccelMps2 = t.AccelMps2.Max(),
                MinAccelMps2 = t.AccelMps2.Min(),
                FinalDistanceM = t.DistanceM[^1],
            },
            Series = Series(t),
        };
    }

    private static Dictionary<string, object?> Figures(FigureSet f) => new()
    {
        ["first_motion_s"] = f.FirstMotionS.Value,
        ["rollout_s"] = f.RolloutTimeS?.Value,
        ["rollout_speed_mps"] = f.RolloutSpeedMps?.Value,
        ["rollout_distance_m"] = f.RolloutDistanceM,
        ["speed_intervals"] = f.SpeedIntervals.Select(i => new
        {
            i.Interval.Label,
            i.Interval.FromMps,
            i.Interval.ToMps,
            i.FromStandstillS,
            i.FromRolloutS,
        }).ToArray(),
        ["distance_marks"] = f.DistanceMarks.Select(m => new
        {
            m.Mark.Label,
            m.Mark.DistanceM,
            m.FromStandstillS,
            m.FromRolloutS,
            m.SpeedAtMarkMps,
            m.TrapSpeedMps,
        }).ToArray(),
        ["peak_accel_mps2"] = f.PeakAccelMps2,
        ["mean_accel_0_to_60_mph_mps2"] = f.MeanAccel0To60Mps2,
        ["max_speed_mps"] = f.MaxSpeedMps,
        ["distance_m"] = f.DistanceM,
    };

    /// <summary>Writes doubles to 0.1 µs / 0.1 µm precision: the truth is far more exact than
    /// that, and 17-digit noise helps no reader.</summary>
    private sealed class RoundingConverter : JsonConverter<double>
    {
        public override double Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) => reader.GetDouble();

        public override void Write(Utf8JsonWriter writer, double value, JsonSerializerOptions options)
        {
            if (double.IsFinite(value))
            {
                writer.WriteNumberValue(Math.Round(value, 7));
            }
            else
            {
                writer.WriteNullValue();
            }
        }
    }

    private static Dictionary<string, long> Health(HealthCounters h) => new()
    {
        ["clock_wraps"] = h.ClockWraps,
        ["pulse_observations_dropped"] = h.PulseObservationsDropped,
        ["accel_read_failures"] = h.AccelReadFailures,
        ["accel_fifo_overflows"] = h.AccelFifoOverflows,
        ["wide_brackets"] = h.WideBrackets,
        ["widest_bracket_micros"] = h.WidestBracketMicros,
        ["counts_went_backwards"] = h.CountsWentBackwards,
        ["frames_refused"] = h.FramesRefused,
        ["accel_samples_clipped"] = h.AccelSamplesClipped,
    };

    private static object Series(Trajectory t)
    {
        var time = new List<double>();
        var distance = new List<double>();
        var speed = new List<double>();
        var accel = new List<double>();
        double next = t.TimeS[0];
        for (int i = 0; i < t.Count; i++)
        {
            if (t.TimeS[i] + 1e-9 < next && i != t.Count - 1)
            {
                continue;
            }

            time.Add(Math.Round(t.TimeS[i], 6));
            distance.Add(Math.Round(t.DistanceM[i], 6));
            speed.Add(Math.Round(t.SpeedMps[i], 6));
            accel.Add(Math.Round(t.AccelMps2[i], 5));
            next = t.TimeS[i] + SeriesStepS;
        }

        return new { StepS = SeriesStepS, TimeS = time, DistanceM = distance, SpeedMps = speed, AccelMps2 = accel };
    }
}
