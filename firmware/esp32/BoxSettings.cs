using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Esp32
{
    /// <summary>The car and box settings compiled into the firmware. Edit, rebuild and deploy
    /// (README.md); every value is written into each run's configuration frame.</summary>
    public static class BoxSettings
    {
        /// <summary>Teeth on the tone ring × edges counted (one edge: rising).</summary>
        public const int PulsesPerRevolution = 48;

        /// <summary>Rolling circumference of the pickup's wheel, measured rolled and loaded (µm).</summary>
        public const int CircumferenceMicrometres = 1960000;

        /// <summary>Rollout distance (µm): 304800 = 1 ft, the drag-strip convention.</summary>
        public const int RolloutMicrometres = 304800;

        /// <summary>The accelerometer axis along the car: 0 = x, 1 = y, 2 = z.</summary>
        public const int ForwardAxis = 0;

        /// <summary>True when that axis points backwards.</summary>
        public const bool ForwardAxisReversed = false;

        /// <summary>Accelerometer full scale (g): 2, 4, 8 or 16.</summary>
        public const int AccelRangeG = 8;

        /// <summary>Length of the blocks whose means the staging still test bounds (ms), 1 to 500: long
        /// enough that the sensor's noise and the engine's shake average out (50 ms passes a fifth of a
        /// 30 Hz shake), short beside the one-second staging hold. The accelerometer onset averages over
        /// a block too, so a launch only just over the motion threshold may open its run up to a block
        /// after it starts (DEVELOPERS.md). The same setting, default and range as the Linux board's
        /// <c>accelerometer.still_block_ms</c>; written in each run's configuration frame.</summary>
        public const int StillBlockMs = LoggerSettings.DefaultStillBlockMs;

        /// <summary>I2C address of the LIS3DH: 0x18 with SDO/SA0 low, 0x19 with it high.</summary>
        public const int AccelI2cAddress = 0x18;

        /// <summary>Line speed of the COM2 stream.</summary>
        public const int SerialBaudRate = 115200;

        /// <summary>How often the log file is flushed to the card (ms).</summary>
        public const int FlushIntervalMs = 500;

        /// <summary>The core's settings for this box and the accelerometer found (or none).</summary>
        /// <exception cref="System.ArgumentException">A setting above is out of range; the message names it.</exception>
        public static LoggerSettings Create(IAccelerometer accelerometer)
        {
            return Create(accelerometer, StillBlockMs);
        }

        /// <summary><see cref="Create(IAccelerometer)"/> with the still block given (ms), checked as the
        /// Linux board checks its file's (<see cref="LoggerSettings.CheckStillBlockMs"/>).</summary>
        /// <exception cref="System.ArgumentException"><paramref name="stillBlockMs"/> is outside 1 to 500.</exception>
        public static LoggerSettings Create(IAccelerometer accelerometer, int stillBlockMs)
        {
            string problem = LoggerSettings.CheckStillBlockMs("BoxSettings.StillBlockMs", stillBlockMs);
            if (problem != null)
            {
                throw new System.ArgumentException(problem);
            }

            LoggerSettings settings = new LoggerSettings();
            settings.PulsesPerRevolution = PulsesPerRevolution;
            settings.CircumferenceMicrometres = CircumferenceMicrometres;
            settings.RolloutMicrometres = RolloutMicrometres;
            settings.SecondChannelEnabled = PinMap.SecondWheelPulse >= 0;
            settings.SecondPulsesPerRevolution = PulsesPerRevolution;
            settings.SecondCircumferenceMicrometres = CircumferenceMicrometres;
            settings.ForwardAxis = ForwardAxis;
            settings.ForwardAxisReversed = ForwardAxisReversed;
            settings.AccelPresent = accelerometer != null;
            settings.StillBlockMicros = stillBlockMs * 1000;
            if (accelerometer != null)
            {
                settings.AccelOutputDataRateMilliHz = accelerometer.OutputDataRateMilliHz;
                settings.AccelFullScaleMilliG = accelerometer.FullScaleMilliG;
            }

            StepBudget.Apply(settings);
            return settings;
        }
    }
}
