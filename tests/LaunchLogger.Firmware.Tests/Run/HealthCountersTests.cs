using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

public class HealthCountersTests
{
    [Fact]
    public void GetReturnsTheCountersInTheHealthFrameOrder()
    {
        // LOG-FORMAT.md, frame 0x05: the order of the counters.
        var health = new HealthCounters
        {
            ClockWraps = 10,
            PulseObservationsDropped = 11,
            AccelReadFailures = 12,
            AccelFifoOverflows = 13,
            WideBrackets = 14,
            WidestBracketMicros = 15,
            CountsWentBackwards = 16,
            FramesRefused = 17,
            AccelSamplesClipped = 18,
        };

        Assert.Equal(9, LogFormat.HealthCounterCount);
        Assert.Equal(Enumerable.Range(10, 9).Select(i => (long)i), Enumerable.Range(0, LogFormat.HealthCounterCount).Select(health.Get));
        Assert.Equal(0, health.Get(LogFormat.HealthCounterCount));
        Assert.Equal(0, health.Get(-1));
    }
}
