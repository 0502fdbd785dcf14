namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A hardware edge counter per pulse channel, read by polling (the ESP32 path).</summary>
    public interface IPulseCounter
    {
        /// <summary>How many channels the counter serves (1 or 2).</summary>
        int ChannelCount { get; }

        /// <summary>The cumulative edge count of a channel since power-up.</summary>
        long ReadCount(int channel);
    }
}
