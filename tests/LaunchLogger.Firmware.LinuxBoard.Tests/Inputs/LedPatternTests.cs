using LaunchLogger.Firmware.LinuxBoard.Inputs;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Inputs;

public class LedPatternTests
{
    [Theory]
    [InlineData(RunPhase.Idle, 200)]
    [InlineData(RunPhase.Staged, 2000)]
    [InlineData(RunPhase.Moving, 1000)]
    [InlineData(RunPhase.RolledOut, 1600)]
    [InlineData(RunPhase.Stopped, 200)]
    public void Lit_milliseconds_per_two_seconds_tell_the_phases_apart(RunPhase phase, int litPerTwoSeconds)
    {
        int lit = 0;
        for (long ms = 0; ms < 2000; ms++)
        {
            if (LedPattern.IsOn(phase, ms))
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
            bool on = LedPattern.IsOn(RunPhase.Stopped, ms);
            if (on && !was)
            {
                rises++;
            }

            was = on;
        }

        Assert.Equal(2, rises);
    }
}
