using System.Text.Json;
using LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Configuration;

/// <summary>Reads and checks the board's JSON settings file.</summary>
public static class BoardSettingsFile
{
    /// <summary>Keys are snake_case, like every other file the project reads and writes.</summary>
    private static readonly JsonSerializerOptions Options = Create(JsonNamingPolicy.SnakeCaseLower);

    /// <summary>Files written before the keys became snake_case used camelCase; they still load.</summary>
    private static readonly JsonSerializerOptions LegacyOptions = Create(JsonNamingPolicy.CamelCase);

    private static JsonSerializerOptions Create(JsonNamingPolicy naming) => new()
    {
        PropertyNamingPolicy = naming,
        ReadCommentHandling = JsonCommentHandling.Skip,
        AllowTrailingCommas = true,
        UnmappedMemberHandling = System.Text.Json.Serialization.JsonUnmappedMemberHandling.Disallow,
    };

    /// <summary>Reads <paramref name="path"/> and checks every value.</summary>
    /// <exception cref="BoardSettingsException">The file is missing, is not valid JSON, has an
    /// unknown or missing key, or a value out of range; the message names the file, the key and
    /// what is allowed.</exception>
    public static BoardSettings Load(string path)
    {
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new BoardSettingsException(path + ": cannot read the settings file (" + e.Message + ")");
        }

        return Parse(text, path);
    }

    /// <summary>Parses settings text; <paramref name="source"/> names it in error messages.</summary>
    /// <exception cref="BoardSettingsException">As for <see cref="Load"/>.</exception>
    public static BoardSettings Parse(string json, string source)
    {
        BoardSettings? settings;
        try
        {
            settings = JsonSerializer.Deserialize<BoardSettings>(json, Options);
        }
        catch (JsonException e)
        {
            if (TryLegacy(json, out settings))
            {
                return Checked(settings!, source);
            }

            string where = e.LineNumber.HasValue ? " line " + (e.LineNumber.Value + 1) : "";
            string key = string.IsNullOrEmpty(e.Path) ? "" : " at " + e.Path;
            throw new BoardSettingsException(source + ":" + where + key + ": " + FirstSentence(e.Message));
        }

        if (settings == null)
        {
            throw new BoardSettingsException(source + ": the file holds no settings object");
        }

        return Checked(settings, source);
    }

    private static BoardSettings Checked(BoardSettings settings, string source)
    {
        string? problem = Check(settings);
        if (problem != null)
        {
            throw new BoardSettingsException(source + ": " + problem);
        }

        return settings;
    }

    /// <summary>The core's settings for this board, the accelerometer's true rate and range
    /// filled in by the caller once the chip is set up.</summary>
    public static LoggerSettings ToLoggerSettings(BoardSettings board)
    {
        var logger = new LoggerSettings
        {
            PulsesPerRevolution = board.Car.PulsesPerRevolution,
            CircumferenceMicrometres = Micrometres(board.Car.CircumferenceMillimetres),
            RolloutMicrometres = Micrometres(board.Car.RolloutMillimetres),
            SecondChannelEnabled = board.Pulses.SecondLine.HasValue,
            AccelPresent = board.Accelerometer != null,
        };
        if (board.Pulses.SecondLine.HasValue)
        {
            logger.SecondPulsesPerRevolution = board.Car.SecondPulsesPerRevolution ?? board.Car.PulsesPerRevolution;
            logger.SecondCircumferenceMicrometres = Micrometres(board.Car.SecondCircumferenceMillimetres ?? board.Car.CircumferenceMillimetres);
        }

        if (board.Accelerometer != null)
        {
            logger.AccelOutputDataRateMilliHz = board.Accelerometer.RateHz * 1000;
            logger.AccelFullScaleMilliG = board.Accelerometer.RangeG * 1000;
            logger.ForwardAxis = AxisIndex(board.Accelerometer.ForwardAxis);
            logger.ForwardAxisReversed = board.Accelerometer.ForwardAxisReversed;
            logger.StillBlockMicros = board.Accelerometer.StillBlockMs * 1000;
        }

        if (board.BenchRest != null)
        {
            logger.BenchRestHoldMicros = board.BenchRest.HoldMs * 1000;
            logger.BenchRestMicros = board.BenchRest.LengthMs * 1000;
        }

        return logger;
    }

    /// <summary>The edge selection named in the file.</summary>
    public static EdgeSelection ParseEdges(string text)
    {
        return text switch
        {
            "rising" => EdgeSelection.Rising,
            "falling" => EdgeSelection.Falling,
            "both" => EdgeSelection.Both,
            _ => throw new BoardSettingsException("pulses.edges must be \"rising\", \"falling\" or \"both\" (was \"" + text + "\")"),
        };
    }

    /// <summary>The line bias named in the file.</summary>
    public static LineBias ParseBias(string text)
    {
        return text switch
        {
            "as-is" => LineBias.AsIs,
            "pull-up" => LineBias.PullUp,
            "pull-down" => LineBias.PullDown,
            "disabled" => LineBias.Disabled,
            _ => throw new BoardSettingsException("pulses.bias must be \"as-is\", \"pull-up\", \"pull-down\" or \"disabled\" (was \"" + text + "\")"),
        };
    }

    private static string? Check(BoardSettings s)
    {
        if (s.Car.CircumferenceMillimetres < 100 || s.Car.CircumferenceMillimetres > 10000)
        {
            return "car.circumference_millimetres must be from 100 to 10000 (was " + s.Car.CircumferenceMillimetres + ")";
        }

        if (s.Pulses.Line < 0)
        {
            return "pulses.line must be a line offset, 0 or more (was " + s.Pulses.Line + ")";
        }

        if (s.Pulses.SecondLine.HasValue && (s.Pulses.SecondLine.Value < 0 || s.Pulses.SecondLine.Value == s.Pulses.Line))
        {
            return "pulses.second_line must be another line offset than pulses.line (was " + s.Pulses.SecondLine.Value + ")";
        }

        if (s.Pulses.KernelEventBuffer < 16 || s.Pulses.KernelEventBuffer > 65536)
        {
            return "pulses.kernel_event_buffer must be from 16 to 65536 (was " + s.Pulses.KernelEventBuffer + ")";
        }

        try
        {
            ParseEdges(s.Pulses.Edges);
            ParseBias(s.Pulses.Bias);
        }
        catch (BoardSettingsException e)
        {
            return e.Message;
        }

        if (s.Accelerometer is { } a)
        {
            if (a.Chip != "lis3dh")
            {
                return "accelerometer.chip must be \"lis3dh\" (was \"" + a.Chip + "\")";
            }

            if (a.I2cAddress != 0x18 && a.I2cAddress != 0x19)
            {
                return "accelerometer.i2c_address must be 24 (0x18) or 25 (0x19) for a LIS3DH (was " + a.I2cAddress + ")";
            }

            if (a.I2cBus < 0)
            {
                return "accelerometer.i2c_bus must be 0 or more (was " + a.I2cBus + ")";
            }

            if (a.RateHz != 400 && a.RateHz != 1344)
            {
                return "accelerometer.rate_hz must be 400 or 1344 for a LIS3DH (was " + a.RateHz + ")";
            }

            if (a.RangeG != 2 && a.RangeG != 4 && a.RangeG != 8 && a.RangeG != 16)
            {
                return "accelerometer.range_g must be 2, 4, 8 or 16 (was " + a.RangeG + ")";
            }

            if (AxisIndex(a.ForwardAxis) < 0)
            {
                return "accelerometer.forward_axis must be \"x\", \"y\" or \"z\" (was \"" + a.ForwardAxis + "\")";
            }

            // The core's range, checked here in the file's units (the ESP32's settings use the same check).
            if (LoggerSettings.CheckStillBlockMs("accelerometer.still_block_ms", a.StillBlockMs) is { } stillBlock)
            {
                return stillBlock;
            }
        }

        if (s.Inputs is { } i && (i.DebounceMs < 0 || i.DebounceMs > 1000))
        {
            return "inputs.debounce_ms must be from 0 to 1000 (was " + i.DebounceMs + ")";
        }

        if (string.IsNullOrWhiteSpace(s.Log.Folder))
        {
            return "log.folder must name a folder";
        }

        if (s.Log.FlushIntervalMs < 0 || s.Log.FsyncIntervalMs < 0)
        {
            return "log.flush_interval_ms and log.fsync_interval_ms must be 0 or more";
        }

        if (s.Serial is { } serial)
        {
            if (string.IsNullOrWhiteSpace(serial.Port))
            {
                return "serial.port must name a device such as /dev/ttyGS0";
            }

            if (serial.WriteTimeoutMs < 1 || serial.WriteTimeoutMs > 10000)
            {
                return "serial.write_timeout_ms must be from 1 to 10000 (was " + serial.WriteTimeoutMs + ")";
            }
        }

        if (s.BenchRest is { } rest)
        {
            if (s.Accelerometer == null)
            {
                return "bench_rest needs an accelerometer section (a bench rest records the accelerometer)";
            }

            if (s.Inputs?.MarkPin == null)
            {
                return "bench_rest needs inputs.mark_pin (holding the mark button arms a bench rest)";
            }

            // The core's ranges (LoggerSettings.Validate), checked here in the file's units.
            if (rest.HoldMs < 500 || rest.HoldMs > 60000)
            {
                return "bench_rest.hold_ms must be from 500 to 60000 (was " + rest.HoldMs + ")";
            }

            if (rest.LengthMs < 1000 || rest.LengthMs > 600000)
            {
                return "bench_rest.length_ms must be from 1000 to 600000 (was " + rest.LengthMs + ")";
            }
        }

        return ToLoggerSettings(s).Validate();
    }

    /// <summary>Reads a camelCase file of the earlier format; false when that fails too, so the
    /// snake_case error is the one reported.</summary>
    private static bool TryLegacy(string json, out BoardSettings? settings)
    {
        try
        {
            settings = JsonSerializer.Deserialize<BoardSettings>(json, LegacyOptions);
            return settings != null;
        }
        catch (JsonException)
        {
            settings = null;
            return false;
        }
    }

    private static int AxisIndex(string axis)
    {
        return axis switch
        {
            "x" => 0,
            "y" => 1,
            "z" => 2,
            _ => -1,
        };
    }

    private static int Micrometres(double millimetres)
    {
        return (int)Math.Clamp(Math.Round(millimetres * 1000.0), int.MinValue, int.MaxValue);
    }

    private static string FirstSentence(string message)
    {
        int cut = message.IndexOf(" Path:", StringComparison.Ordinal);
        return cut > 0 ? message.Substring(0, cut) : message;
    }
}
