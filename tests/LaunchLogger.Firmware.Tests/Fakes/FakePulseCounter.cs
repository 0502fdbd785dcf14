using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A hardware edge counter whose counts the test sets.</summary>
public sealed class FakePulseCounter : IPulseCounter
{
    private readonly long[] counts;

    public FakePulseCounter(int channels)
    {
        counts = new long[channels];
    }

    public int ChannelCount => counts.Length;

    /// <summary>Called just before each read, so a test can move the count while it is being read.</summary>
    public Action<int>? BeforeRead { get; set; }

    public long this[int channel]
    {
        get => counts[channel];
        set => counts[channel] = value;
    }

    public long ReadCount(int channel)
    {
        BeforeRead?.Invoke(channel);
        return counts[channel];
    }
}
