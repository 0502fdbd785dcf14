namespace LaunchLogger.Firmware.Wire
{
    /// <summary>Constants of the log format shared by the firmware and the host reader.</summary>
    public static class LogFormat
    {
        /// <summary>The format version written in every configuration frame.</summary>
        public const byte Version = 1;

        /// <summary>The frame delimiter on the wire.</summary>
        public const byte Delimiter = 0x00;

        /// <summary>Bytes before the body: type (1) and sequence number (2).</summary>
        public const int HeaderBytes = 3;

        /// <summary>Bytes of the CRC that ends every payload.</summary>
        public const int CrcBytes = 4;

        /// <summary>The smallest valid payload: header and CRC with an empty body.</summary>
        public const int MinPayloadBytes = HeaderBytes + CrcBytes;

        /// <summary>The largest payload a writer produces and a reader accepts.</summary>
        public const int MaxPayloadBytes = 1024;

        /// <summary>The largest a stuffed frame can be, delimiter included.</summary>
        public const int MaxEncodedFrameBytes = MaxPayloadBytes + (MaxPayloadBytes / 254) + 2;

        /// <summary>Number of counters a version-1 health frame carries.</summary>
        public const int HealthCounterCount = 9;

        /// <summary>Configuration flag: an accelerometer is fitted.</summary>
        public const byte ConfigFlagAccelerometer = 0x01;

        /// <summary>Configuration flag: a second pulse channel is fitted.</summary>
        public const byte ConfigFlagSecondChannel = 0x02;

        /// <summary>Configuration flag: the run opened from standstill after staging.</summary>
        public const byte ConfigFlagStaged = 0x04;

        /// <summary>Summary flag: the run opened from standstill after staging.</summary>
        public const byte SummaryFlagStaged = 0x01;

        /// <summary>Summary flag: the rollout distance was reached.</summary>
        public const byte SummaryFlagRolloutReached = 0x02;

        /// <summary>Summary flag: the run closed because the car stopped.</summary>
        public const byte SummaryFlagClosedByStop = 0x04;

        /// <summary>Bench rest end: recorded for its whole set length.</summary>
        public const byte BenchRestComplete = 0;

        /// <summary>Bench rest end: a wheel pulse came during it (the car moved); not a rest.</summary>
        public const byte BenchRestSpoiledByPulse = 1;

        /// <summary>Bench rest end: cut short before its set length (the box shut down).</summary>
        public const byte BenchRestCutShort = 2;
    }
}
