namespace LaunchLogger.Esp32
{
    /// <summary>Which ESP32 GPIO does what on an ESP32-WROOM-32 DevKit (README.md, pin map).</summary>
    /// <remarks>Strapping pins (GPIO 0, 2, 12, 15) are avoided except GPIO 5 as the SD card's
    /// chip select, its usual role; GPIO 34–39 are inputs without pull-ups, used for the pickups
    /// whose input stages have their own pull-up.</remarks>
    public static class PinMap
    {
        /// <summary>Distance wheel pickup (channel 0), after its input stage.</summary>
        public const int WheelPulse = 34;

        /// <summary>Second wheel pickup (channel 1), or -1 when not fitted.</summary>
        public const int SecondWheelPulse = -1;

        /// <summary>Brake switch input (opto-coupler output: low while braking).</summary>
        public const int BrakeSwitch = 32;

        /// <summary>Mark button (to ground: low while pressed).</summary>
        public const int MarkButton = 33;

        /// <summary>Status LED (through 470 Ω to ground).</summary>
        public const int StatusLed = 25;

        /// <summary>I2C1 data to the accelerometer.</summary>
        public const int I2cData = 21;

        /// <summary>I2C1 clock to the accelerometer.</summary>
        public const int I2cClock = 22;

        /// <summary>SPI1 MOSI to the SD card.</summary>
        public const int SdMosi = 23;

        /// <summary>SPI1 MISO from the SD card.</summary>
        public const int SdMiso = 19;

        /// <summary>SPI1 clock to the SD card.</summary>
        public const int SdClock = 18;

        /// <summary>SD card chip select.</summary>
        public const int SdChipSelect = 5;

        /// <summary>COM2 transmit: the live log stream to a USB-serial adapter's RX.</summary>
        public const int SerialTx = 17;

        /// <summary>COM2 receive (unused by the firmware, wired for completeness).</summary>
        public const int SerialRx = 16;
    }
}
