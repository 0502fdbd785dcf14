using System.Text.Json.Serialization;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Configuration;

/// <summary>The board's settings file: the car, where each sensor is wired, where the log goes.
/// See launchlogger-board.example.json for every key with a comment.</summary>
public sealed class BoardSettings
{
    /// <summary>The car and its distance pickup.</summary>
    [JsonRequired]
    public CarSection Car { get; set; } = new();

    /// <summary>Where the pickup is wired.</summary>
    [JsonRequired]
    public PulseSection Pulses { get; set; } = new();

    /// <summary>The accelerometer, or null for none.</summary>
    public AccelerometerSection? Accelerometer { get; set; }

    /// <summary>Brake switch, mark button and status LED, or null for none.</summary>
    public InputSection? Inputs { get; set; }

    /// <summary>Where the log file goes.</summary>
    [JsonRequired]
    public LogSection Log { get; set; } = new();

    /// <summary>The live serial stream, or null for none.</summary>
    public SerialSection? Serial { get; set; }

    /// <summary>The bench rest's hold and length, or null for the core's defaults (3 s, 20 s).</summary>
    public BenchRestSection? BenchRest { get; set; }

    /// <summary>The car.</summary>
    public sealed class CarSection
    {
        /// <summary>Pulses per wheel revolution: teeth × edges counted (1 or 2).</summary>
        [JsonRequired]
        public int PulsesPerRevolution { get; set; }

        /// <summary>Rolling circumference of the pickup's wheel, millimetres (measured rolled, loaded).</summary>
        [JsonRequired]
        public double CircumferenceMillimetres { get; set; }

        /// <summary>Pulses per revolution of the second wheel, when a second line is wired.</summary>
        public int? SecondPulsesPerRevolution { get; set; }

        /// <summary>Rolling circumference of the second wheel, millimetres.</summary>
        public double? SecondCircumferenceMillimetres { get; set; }

        /// <summary>Rollout distance in millimetres; 304.8 (1 ft) when left out.</summary>
        public double RolloutMillimetres { get; set; } = 304.8;
    }

    /// <summary>The pickup lines on a GPIO character device.</summary>
    public sealed class PulseSection
    {
        /// <summary>The chip's device, e.g. /dev/gpiochip0.</summary>
        public string Chip { get; set; } = "/dev/gpiochip0";

        /// <summary>The distance pickup's line offset on that chip.</summary>
        [JsonRequired]
        public int Line { get; set; }

        /// <summary>A second wheel's pickup line, or null.</summary>
        public int? SecondLine { get; set; }

        /// <summary>"rising", "falling" or "both".</summary>
        public string Edges { get; set; } = "rising";

        /// <summary>"as-is", "pull-up", "pull-down" or "disabled".</summary>
        public string Bias { get; set; } = "as-is";

        /// <summary>Events the kernel should be able to hold between two reads.</summary>
        public int KernelEventBuffer { get; set; } = 1024;
    }

    /// <summary>The I2C accelerometer.</summary>
    public sealed class AccelerometerSection
    {
        /// <summary>"lis3dh".</summary>
        public string Chip { get; set; } = "lis3dh";

        /// <summary>I2C bus number (/dev/i2c-N).</summary>
        public int I2cBus { get; set; } = 1;

        /// <summary>I2C address, 24 (0x18) or 25 (0x19) for a LIS3DH.</summary>
        public int I2cAddress { get; set; } = 0x18;

        /// <summary>Output data rate, Hz (LIS3DH: 400 or 1344).</summary>
        public int RateHz { get; set; } = 1344;

        /// <summary>Full scale, g (2, 4, 8 or 16).</summary>
        public int RangeG { get; set; } = 8;

        /// <summary>"x", "y" or "z": the sensor axis along the car.</summary>
        public string ForwardAxis { get; set; } = "x";

        /// <summary>True when that axis points backwards.</summary>
        public bool ForwardAxisReversed { get; set; }

        /// <summary>Length of the blocks whose means the staging still test bounds, milliseconds
        /// (the core's <c>LoggerSettings.StillBlockMicros</c>, written in each run's configuration;
        /// default and range the core's, as on the ESP32).</summary>
        public int StillBlockMs { get; set; } = LoggerSettings.DefaultStillBlockMs;
    }

    /// <summary>Switches and LED on GPIO pins (System.Device.Gpio numbering).</summary>
    public sealed class InputSection
    {
        /// <summary>The GPIO chip number for these pins; null uses the default controller.</summary>
        public int? GpioChip { get; set; }

        /// <summary>Brake switch pin, or null.</summary>
        public int? BrakePin { get; set; }

        /// <summary>True when the brake input reads low with the brake on.</summary>
        public bool BrakeActiveLow { get; set; } = true;

        /// <summary>Mark button pin, or null.</summary>
        public int? MarkPin { get; set; }

        /// <summary>True when the button reads low while pressed.</summary>
        public bool MarkActiveLow { get; set; } = true;

        /// <summary>Status LED pin, or null.</summary>
        public int? LedPin { get; set; }

        /// <summary>How long a switch level must hold to count, milliseconds.</summary>
        public int DebounceMs { get; set; } = 20;
    }

    /// <summary>The log file.</summary>
    public sealed class LogSection
    {
        /// <summary>Folder for log files (created if missing).</summary>
        [JsonRequired]
        public string Folder { get; set; } = "";

        /// <summary>0 flushes every frame to the kernel; otherwise at most this often.</summary>
        public int FlushIntervalMs { get; set; }

        /// <summary>Least time between forced writes to the card (fsync).</summary>
        public int FsyncIntervalMs { get; set; } = 1000;
    }

    /// <summary>The serial stream.</summary>
    public sealed class SerialSection
    {
        /// <summary>Port device, e.g. /dev/ttyGS0 (USB gadget) or /dev/ttyAMA0 (UART).</summary>
        [JsonRequired]
        public string Port { get; set; } = "";

        /// <summary>Line speed.</summary>
        public int BaudRate { get; set; } = 115200;

        /// <summary>The longest one write may block, milliseconds.</summary>
        public int WriteTimeoutMs { get; set; } = 250;
    }

    /// <summary>The bench rest (hardware-notes/calibration.md §5): the mark button held
    /// <see cref="HoldMs"/> while staged arms it; from the release the accelerometer is recorded
    /// for <see cref="LengthMs"/>.</summary>
    public sealed class BenchRestSection
    {
        /// <summary>How long the mark button must be held while staged, milliseconds.</summary>
        public int HoldMs { get; set; } = 3000;

        /// <summary>How long the rest records from the button's release, milliseconds.</summary>
        public int LengthMs { get; set; } = 20000;
    }
}
