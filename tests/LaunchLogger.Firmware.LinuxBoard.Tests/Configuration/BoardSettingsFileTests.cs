using LaunchLogger.Firmware.LinuxBoard.Configuration;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Configuration;

public class BoardSettingsFileTests
{
    private const string Minimal = """
        {
          "car": { "pulses_per_revolution": 48, "circumference_millimetres": 1960 },
          "pulses": { "line": 17 },
          "log": { "folder": "/tmp/ll" }
        }
        """;

    [Fact]
    public void The_shipped_example_file_loads()
    {
        string path = Path.Combine(AppContext.BaseDirectory, "launchlogger-board.example.json");

        BoardSettings s = BoardSettingsFile.Load(path);

        Assert.Equal(48, s.Car.PulsesPerRevolution);
        Assert.Equal("/dev/gpiochip0", s.Pulses.Chip);
        Assert.Equal("lis3dh", s.Accelerometer!.Chip);
        Assert.Equal("/dev/ttyGS0", s.Serial!.Port);
        Assert.Null(s.Pulses.SecondLine);
    }

    [Fact]
    public void Millimetres_become_the_cores_micrometres_and_rollout_defaults_to_one_foot()
    {
        LoggerSettings logger = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(Minimal, "test"));

        Assert.Equal(1_960_000, logger.CircumferenceMicrometres);
        // 1 ft = 0.3048 m exactly (international yard and pound agreement, 1959).
        Assert.Equal(304_800, logger.RolloutMicrometres);
        Assert.False(logger.AccelPresent);
        Assert.False(logger.SecondChannelEnabled);
        Assert.Null(logger.Validate());
    }

    [Fact]
    public void A_second_line_enables_the_second_channel_with_the_cars_values()
    {
        string json = Minimal.Replace("\"line\": 17", "\"line\": 17, \"second_line\": 18");
        LoggerSettings logger = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(json, "test"));

        Assert.True(logger.SecondChannelEnabled);
        Assert.Equal(48, logger.SecondPulsesPerRevolution);
        Assert.Equal(1_960_000, logger.SecondCircumferenceMicrometres);
    }

    [Fact]
    public void A_camel_case_file_of_the_earlier_format_still_loads()
    {
        const string earlier = """
            {
              "car": { "pulsesPerRevolution": 36, "circumferenceMillimetres": 1880 },
              "pulses": { "line": 5, "secondLine": 6, "kernelEventBuffer": 512 },
              "inputs": { "ledPin": 23, "debounceMs": 15 },
              "log": { "folder": "/tmp/ll", "fsyncIntervalMs": 500 }
            }
            """;

        BoardSettings s = BoardSettingsFile.Parse(earlier, "old.json");

        Assert.Equal(36, s.Car.PulsesPerRevolution);
        Assert.Equal(1880, s.Car.CircumferenceMillimetres);
        Assert.Equal(6, s.Pulses.SecondLine);
        Assert.Equal(512, s.Pulses.KernelEventBuffer);
        Assert.Equal(23, s.Inputs!.LedPin);
        Assert.Equal(15, s.Inputs.DebounceMs);
        Assert.Equal(500, s.Log.FsyncIntervalMs);
    }

    [Fact]
    public void A_typo_in_a_snake_case_file_names_the_snake_case_problem()
    {
        var e = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Parse(Minimal.Replace("\"folder\"", "\"fodler\""), "s.json"));
        Assert.Contains("fodler", e.Message);
    }

    [Theory]
    [InlineData("unknown key", "\"line\": 17", "\"line\": 17, \"lien\": 3", "lien")]
    [InlineData("missing required key", "\"pulses\": { \"line\": 17 },", "", "pulses")]
    [InlineData("circumference out of range", "1960", "19600", "car.circumference_millimetres")]
    [InlineData("bad edge name", "\"line\": 17", "\"line\": 17, \"edges\": \"up\"", "pulses.edges")]
    [InlineData("same line twice", "\"line\": 17", "\"line\": 17, \"second_line\": 17", "pulses.second_line")]
    [InlineData("wrong type", "48", "\"forty-eight\"", "pulses_per_revolution")]
    [InlineData("core range", "48", "0", "PulsesPerRevolution")]
    public void Problems_are_reported_with_the_key_that_has_them(string name, string find, string replace, string expectedInMessage)
    {
        _ = name;
        var e = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Parse(Minimal.Replace(find, replace), "settings.json"));
        Assert.StartsWith("settings.json", e.Message);
        Assert.Contains(expectedInMessage, e.Message, StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public void Broken_json_gives_the_line()
    {
        var e = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Parse("{\n  \"car\": {\n    \"pulses_per_revolution\": 48,,\n", "s.json"));
        Assert.Contains("line 3", e.Message);
    }

    [Fact]
    public void A_missing_file_is_a_settings_error()
    {
        var e = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Load("/nonexistent/launchlogger.json"));
        Assert.Contains("/nonexistent/launchlogger.json", e.Message);
    }

    [Theory]
    [InlineData("i2c_address", "36", "accelerometer.i2c_address")]
    [InlineData("rate_hz", "1000", "accelerometer.rate_hz")]
    [InlineData("range_g", "6", "accelerometer.range_g")]
    [InlineData("forward_axis", "\"w\"", "accelerometer.forward_axis")]
    [InlineData("still_block_ms", "0", "accelerometer.still_block_ms must be from 1 to 500 (was 0)")]
    [InlineData("still_block_ms", "501", "accelerometer.still_block_ms must be from 1 to 500 (was 501)")]
    public void Accelerometer_values_are_checked(string key, string value, string expected)
    {
        string json = Minimal.Replace("\"log\"", "\"accelerometer\": { \"" + key + "\": " + value + " }, \"log\"");
        var e = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Parse(json, "s.json"));
        Assert.Contains(expected, e.Message);
    }

    [Fact]
    public void The_still_block_becomes_the_cores_microseconds_and_defaults_to_50_ms()
    {
        string json = Minimal.Replace("\"log\"", "\"accelerometer\": { \"still_block_ms\": 120 }, \"log\"");
        LoggerSettings set = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(json, "test"));
        LoggerSettings left = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(Minimal.Replace("\"log\"", "\"accelerometer\": { }, \"log\""), "test"));
        BoardSettings example = BoardSettingsFile.Load(Path.Combine(AppContext.BaseDirectory, "launchlogger-board.example.json"));

        Assert.Equal(120_000, set.StillBlockMicros);
        Assert.Equal(new LoggerSettings().StillBlockMicros, left.StillBlockMicros);
        Assert.Equal(50, example.Accelerometer!.StillBlockMs);
        Assert.Null(set.Validate());
    }

    private const string WithBenchRest = """
        {
          "car": { "pulses_per_revolution": 48, "circumference_millimetres": 1960 },
          "pulses": { "line": 17 },
          "accelerometer": { },
          "inputs": { "mark_pin": 22 },
          "log": { "folder": "/tmp/ll" },
          "bench_rest": { "hold_ms": 2500, "length_ms": 30000 }
        }
        """;

    [Fact]
    public void The_bench_rests_hold_and_length_become_the_cores_microseconds_and_default_to_3_s_and_20_s()
    {
        LoggerSettings set = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(WithBenchRest, "test"));
        LoggerSettings left = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(WithBenchRest.Replace(", \"length_ms\": 30000", ""), "test"));
        LoggerSettings none = BoardSettingsFile.ToLoggerSettings(BoardSettingsFile.Parse(Minimal, "test"));

        Assert.Equal(2_500_000, set.BenchRestHoldMicros);
        Assert.Equal(30_000_000, set.BenchRestMicros);
        Assert.Equal(2_500_000, left.BenchRestHoldMicros);
        Assert.Equal(20_000_000, left.BenchRestMicros);
        // The documented defaults (hardware-notes/calibration.md §5: hold 3 s, record 20 s).
        Assert.Equal(3_000_000, none.BenchRestHoldMicros);
        Assert.Equal(20_000_000, none.BenchRestMicros);
    }

    [Fact]
    public void The_shipped_example_file_sets_the_bench_rests_defaults()
    {
        string path = Path.Combine(AppContext.BaseDirectory, "launchlogger-board.example.json");

        BoardSettings s = BoardSettingsFile.Load(path);

        Assert.Equal(3000, s.BenchRest!.HoldMs);
        Assert.Equal(20000, s.BenchRest.LengthMs);
    }

    [Theory]
    [InlineData("\"hold_ms\": 2500", "\"hold_ms\": 499", "bench_rest.hold_ms must be from 500 to 60000 (was 499)")]
    [InlineData("\"hold_ms\": 2500", "\"hold_ms\": 60001", "bench_rest.hold_ms must be from 500 to 60000 (was 60001)")]
    [InlineData("\"length_ms\": 30000", "\"length_ms\": 999", "bench_rest.length_ms must be from 1000 to 600000 (was 999)")]
    [InlineData("\"length_ms\": 30000", "\"length_ms\": 3000000", "bench_rest.length_ms must be from 1000 to 600000 (was 3000000)")]
    [InlineData("\"length_ms\": 30000", "\"length_ms\": -5", "bench_rest.length_ms must be from 1000 to 600000 (was -5)")]
    [InlineData("\"hold_ms\": 2500", "\"hold\": 2500", "hold")]
    [InlineData("\"accelerometer\": { },", "", "bench_rest needs an accelerometer section")]
    [InlineData("\"mark_pin\": 22", "\"led_pin\": 23", "bench_rest needs inputs.mark_pin")]
    public void Bench_rest_values_are_checked(string find, string replace, string expected)
    {
        var e = Assert.Throws<BoardSettingsException>(() => BoardSettingsFile.Parse(WithBenchRest.Replace(find, replace), "s.json"));
        Assert.StartsWith("s.json", e.Message);
        Assert.Contains(expected, e.Message);
    }
}
