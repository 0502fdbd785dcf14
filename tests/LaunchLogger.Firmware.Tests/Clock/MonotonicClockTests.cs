using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Clock;

public class MonotonicClockTests
{
    [Fact]
    public void WrapsAreCountedAndTimeStaysMonotonicAcrossSeveralWraps()
    {
        // Start just below the first wrap; each read advances 0.7e9 µs (under one wrap period of
        // 2^32 µs ≈ 71.6 min, as the clock requires).
        var counter = new FakeMicrosecondCounter(0xFFFF_F000) { StepPerRead = 700_000_000 };
        var health = new HealthCounters();
        var clock = new MonotonicClock(counter, health);
        long previous = -1;
        for (int i = 0; i < 40; i++)
        {
            ulong truth = counter.TrueMicros;
            long now = clock.NowMicros();
            Assert.Equal((long)truth, now);
            Assert.True(now > previous);
            Assert.Equal((long)(truth >> 32), health.ClockWraps);
            previous = now;
        }

        Assert.True(health.ClockWraps >= 6);
    }

    [Fact]
    public void TimeStartsAtTheCountersValueAndFollowsItExactly()
    {
        var counter = new FakeMicrosecondCounter(123_456);
        var clock = new MonotonicClock(counter, null!);
        Assert.Equal(123_456, clock.NowMicros());
        counter.TrueMicros = 123_457;
        Assert.Equal(123_457, clock.NowMicros());
        counter.TrueMicros = uint.MaxValue;
        Assert.Equal(uint.MaxValue, clock.NowMicros());
        counter.TrueMicros = (ulong)uint.MaxValue + 1;
        Assert.Equal((long)uint.MaxValue + 1, clock.NowMicros());
    }

    [Fact]
    public void RepeatedReadsWithoutAdvanceDoNotCountAWrap()
    {
        var counter = new FakeMicrosecondCounter(uint.MaxValue);
        var health = new HealthCounters();
        var clock = new MonotonicClock(counter, health);
        for (int i = 0; i < 5; i++)
        {
            Assert.Equal(uint.MaxValue, clock.NowMicros());
        }

        Assert.Equal(0, health.ClockWraps);
    }

    [Fact]
    public void ANullCounterIsRejected()
    {
        Assert.Throws<ArgumentNullException>(() => new MonotonicClock(null!, new HealthCounters()));
    }
}
