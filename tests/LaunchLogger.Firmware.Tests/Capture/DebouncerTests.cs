using LaunchLogger.Firmware.Capture;

namespace LaunchLogger.Firmware.Tests.Capture;

public class DebouncerTests
{
    [Fact]
    public void A_level_that_holds_for_the_hold_time_is_taken()
    {
        var d = new Debouncer(holdMicros: 20_000, initial: false);

        Assert.False(d.Update(true, 1_000));
        Assert.False(d.Update(true, 20_999));
        Assert.True(d.Update(true, 21_000));
    }

    [Fact]
    public void Bounces_shorter_than_the_hold_time_are_ignored()
    {
        var d = new Debouncer(holdMicros: 20_000, initial: false);

        // Contact bounce: the level flips every 2 ms for 10 ms, then settles low again.
        for (long t = 0; t <= 10_000; t += 2_000)
        {
            Assert.False(d.Update(t % 4_000 == 0, t));
        }

        Assert.False(d.Update(false, 40_000));
    }

    [Fact]
    public void Each_change_restarts_the_hold()
    {
        var d = new Debouncer(holdMicros: 10_000, initial: true);

        d.Update(false, 0);
        d.Update(true, 9_000);
        d.Update(false, 12_000);
        Assert.True(d.Update(false, 21_999));
        Assert.False(d.Update(false, 22_000));
    }

    [Fact]
    public void Zero_hold_follows_the_input()
    {
        var d = new Debouncer(holdMicros: 0, initial: false);
        Assert.True(d.Update(true, 5));
        Assert.False(d.Update(false, 5));
    }

    [Fact]
    public void An_accepted_level_is_dated_to_the_reading_that_first_saw_it()
    {
        var d = new Debouncer(holdMicros: 20_000, initial: false);
        Assert.Equal(0, d.ChangedAtMicros);

        d.Update(false, 1_000);
        d.Update(true, 2_500);  // first seen closed; the reading before was 1.5 ms earlier
        d.Update(false, 3_000); // bounce
        d.Update(true, 3_700);  // closed again: this reading, 0.7 ms after the last open one, counts
        Assert.False(d.Update(true, 23_000));
        Assert.True(d.Update(true, 23_700));
        Assert.Equal(3_700, d.ChangedAtMicros);
        Assert.Equal(700, d.ChangeGapMicros);

        // The very first reading has no reading before it: gap unknown.
        var first = new Debouncer(holdMicros: 0, initial: false);
        Assert.True(first.Update(true, 5_000));
        Assert.Equal(5_000, first.ChangedAtMicros);
        Assert.Equal(0, first.ChangeGapMicros);
    }

    [Fact]
    public void A_negative_hold_is_refused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new Debouncer(-1, false));
    }
}
