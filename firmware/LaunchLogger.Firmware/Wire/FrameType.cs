namespace LaunchLogger.Firmware.Wire
{
    /// <summary>The type byte that opens every frame payload (see LOG-FORMAT.md, section 3).</summary>
    public enum FrameType : byte
    {
        /// <summary>Everything needed to decode a run; the first frame of every run.</summary>
        Configuration = 0x01,

        /// <summary>A batch of pulse observations of one channel.</summary>
        Pulses = 0x02,

        /// <summary>One burst (or part of one) of accelerometer samples.</summary>
        Acceleration = 0x03,

        /// <summary>A timed event: staging, motion, rollout, stop, brake switch, mark, gap.</summary>
        Event = 0x04,

        /// <summary>Counters of everything that went wrong since power-up.</summary>
        Health = 0x05,

        /// <summary>The last frame of every run.</summary>
        Summary = 0x06,

        /// <summary>The first frame after power-up (after a lone delimiter), so a reader sees a
        /// restart even when power was cut mid-frame.</summary>
        PowerUp = 0x07,

        /// <summary>A repeat of the open run's configuration, written periodically, so a run whose
        /// configuration frame is damaged can still be decoded.</summary>
        ConfigurationCopy = 0x08,

        /// <summary>A bench rest opens: the accelerometer is recorded with the box standing still,
        /// outside any run, for the calibration against gravity.</summary>
        BenchRest = 0x09,

        /// <summary>A bench rest ends: how (its full length, spoiled by a pulse, cut short) and
        /// what it holds.</summary>
        BenchRestEnd = 0x0A,
    }
}
