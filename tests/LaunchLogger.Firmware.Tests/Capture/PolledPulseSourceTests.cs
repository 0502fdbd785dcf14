using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Capture;

public class PolledPulseSourceTests
{
    private readonly FakeMicrosecondCounter counter = new(1000) { StepPerRead = 2 };
    private readonly FakePulseCounter pulses = new(2);

    [Fact]
    public void BracketRunsFromThePreviousPollsFirstReadingToThisPollsLast()
    {
        var source = Create(); // reads the clock at 1000
        counter.TrueMicros = 1500;
        pulses[0] = 1;
        source.Poll(); // clock read at 1500 before the counters, 1502 after

        Assert.Equal(new[] { Obs(0, 1, 1000, 1502) }, Drain(source));

        counter.TrueMicros = 2000;
        pulses[0] = 2;
        source.Poll();

        // lo = 1500 (previous poll's first reading) < 1502 (previous bracket's end): slight overlap.
        Assert.Equal(new[] { Obs(0, 2, 1500, 2002) }, Drain(source));
    }

    [Fact]
    public void AnEdgeDuringTheCounterReadFallsInsideTheBracket()
    {
        var source = Create();
        counter.TrueMicros = 5000;
        pulses.BeforeRead = channel =>
        {
            // The edge lands while the counters are being read: after the "before" clock reading.
            if (channel == 0 && counter.TrueMicros > 5000 && pulses[0] == 0)
            {
                pulses[0] = 1;
            }
        };
        source.Poll();
        var o = Assert.Single(Drain(source));
        Assert.True(o.Lo < 5001 && 5001 <= o.Hi);
    }

    [Fact]
    public void ACountThatJumpsByMoreThanOneGivesOneObservationOfTheNewCount()
    {
        var source = Create();
        counter.TrueMicros = 3000;
        pulses[0] = 5;
        source.Poll();
        Assert.Equal(new[] { Obs(0, 5, 1000, 3002) }, Drain(source));
    }

    [Fact]
    public void PollsWithoutChangeGiveNothingButMoveTheBracketStart()
    {
        var source = Create();
        counter.TrueMicros = 2000;
        source.Poll();
        Assert.Empty(Drain(source));
        counter.TrueMicros = 3000;
        source.Poll();
        Assert.Empty(Drain(source));

        counter.TrueMicros = 4000;
        pulses[0] = 1;
        source.Poll();
        Assert.Equal(new[] { Obs(0, 1, 3000, 4002) }, Drain(source));
    }

    [Fact]
    public void TwoChannelsChangingInOnePollShareTheBracket()
    {
        var source = Create();
        counter.TrueMicros = 2000;
        pulses[0] = 3;
        pulses[1] = 7;
        source.Poll();
        Assert.Equal(new[] { Obs(0, 3, 1000, 2002), Obs(1, 7, 1000, 2002) }, Drain(source));

        counter.TrueMicros = 2500;
        pulses[1] = 8;
        source.Poll();
        Assert.Equal(new[] { Obs(1, 8, 2000, 2502) }, Drain(source));
    }

    [Fact]
    public void StartsFromTheCountersPresentValues()
    {
        pulses[0] = 100;
        pulses[1] = 200;
        var source = Create();
        counter.TrueMicros = 2000;
        source.Poll();
        Assert.Empty(Drain(source));
        pulses[0] = 101;
        counter.TrueMicros = 3000;
        source.Poll();
        Assert.Equal(new[] { Obs(0, 101, 2000, 3002) }, Drain(source));
    }

    [Fact]
    public void AClockThatDidNotAdvanceStillGivesABracketOneMicrosecondWide()
    {
        counter.StepPerRead = 0;
        var source = Create();
        pulses[0] = 1;
        source.Poll();
        Assert.Equal(new[] { Obs(0, 1, 1000, 1001) }, Drain(source));
    }

    [Fact]
    public void NullArgumentsAreRejected()
    {
        var clock = new MonotonicClock(counter, null!);
        Assert.Throws<ArgumentNullException>(() => new PolledPulseSource(null!, clock));
        Assert.Throws<ArgumentNullException>(() => new PolledPulseSource(pulses, null!));
    }

    /// <summary>The clock's own first reading does not advance the fake time, so the source's
    /// start reading is the counter's start value (1000).</summary>
    private PolledPulseSource Create()
    {
        uint step = counter.StepPerRead;
        counter.StepPerRead = 0;
        var clock = new MonotonicClock(counter, null!);
        counter.StepPerRead = step;
        return new PolledPulseSource(pulses, clock);
    }

    private static (int Channel, long Count, long Lo, long Hi) Obs(int channel, long count, long lo, long hi) => (channel, count, lo, hi);

    private static List<(int Channel, long Count, long Lo, long Hi)> Drain(PolledPulseSource source)
    {
        var list = new List<(int, long, long, long)>();
        while (source.TryRead(out PulseObservation o))
        {
            list.Add((o.Channel, o.Count, o.LoMicros, o.HiMicros));
        }

        return list;
    }
}
