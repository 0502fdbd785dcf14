using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Tests.Run;

public class PhaseBlinkPatternTests
{
    [Theory]
    [InlineData(RunPhase.Idle, 200)]
    [InlineData(RunPhase.Staged, 2000)]
    [InlineData(RunPhase.Moving, 1000)]
    [InlineData(RunPhase.RolledOut, 1600)]
    [InlineData(RunPhase.Stopped, 200)]
    [InlineData(RunPhase.BenchRest, 600)]
    public void Lit_milliseconds_per_two_seconds_tell_the_phases_apart(RunPhase phase, int litPerTwoSeconds)
    {
        int lit = 0;
        for (long ms = 0; ms < 2000; ms++)
        {
            if (PhaseBlinkPattern.IsOn(phase, ms))
            {
                lit++;
            }
        }

        Assert.Equal(litPerTwoSeconds, lit);
    }

    [Fact]
    public void Stopped_blinks_twice_per_period()
    {
        int rises = 0;
        bool was = false;
        for (long ms = 0; ms < 2000; ms++)
        {
            bool on = PhaseBlinkPattern.IsOn(RunPhase.Stopped, ms);
            if (on && !was)
            {
                rises++;
            }

            was = on;
        }

        Assert.Equal(2, rises);
    }

    [Fact]
    public void Each_pattern_repeats_with_its_period()
    {
        long[] periods = { 1000, 1, 200, 500, 2000, 2000 };
        foreach (RunPhase phase in Enum.GetValues<RunPhase>())
        {
            long period = periods[(int)phase];
            for (long ms = 0; ms < 2000; ms++)
            {
                Assert.Equal(PhaseBlinkPattern.IsOn(phase, ms), PhaseBlinkPattern.IsOn(phase, ms + period));
            }
        }
    }

    [Fact]
    public void Fault_is_three_50_ms_blinks_each_second()
    {
        int lit = 0;
        int rises = 0;
        bool was = false;
        for (long ms = 0; ms < 1000; ms++)
        {
            bool on = PhaseBlinkPattern.IsFault(ms);
            Assert.Equal(on, PhaseBlinkPattern.IsFault(ms + 1000));
            lit += on ? 1 : 0;
            rises += on && !was ? 1 : 0;
            was = on;
        }

        Assert.Equal(150, lit);
        Assert.Equal(3, rises);
    }

    [Fact]
    public void APhaseOutsideTheKnownOnesKeepsTheLightOff()
    {
        Assert.All(new long[] { 0, 50, 150, 999 }, ms => Assert.False(PhaseBlinkPattern.IsOn((RunPhase)99, ms)));
    }
}
