using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reading;

/// <summary>Sequence numbers (LOG-FORMAT.md, section 1) tell duplicates, swaps, gaps, restarts
/// and joined logs apart: a backward step is never taken as a forward wrap.</summary>
public class SequenceTests
{
    [Fact]
    public void One_duplicated_frame_is_dropped_and_nothing_is_lost()
    {
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(5), TestFrames.Mark(5), TestFrames.Mark(6)));

        Assert.Equal(2, r.Frames.Count);
        Assert.Equal(0, r.Stats.FramesLost);
        Assert.Equal(1, r.Stats.DuplicateFrames);
        Assert.Equal(0, r.Stats.Restarts);
    }

    [Fact]
    public void Two_swapped_frames_are_both_read_and_nothing_is_lost()
    {
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(5), TestFrames.Mark(7), TestFrames.Mark(6), TestFrames.Mark(8)));

        Assert.Equal(4, r.Frames.Count);
        Assert.Equal(0, r.Stats.FramesLost);
        Assert.Equal(1, r.Stats.LateFrames);
    }

    [Fact]
    public void A_replayed_stretch_is_dropped_and_nothing_is_lost()
    {
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(
            TestFrames.Mark(5), TestFrames.Mark(6), TestFrames.Mark(7), TestFrames.Mark(5), TestFrames.Mark(6), TestFrames.Mark(7), TestFrames.Mark(8)));

        Assert.Equal(4, r.Frames.Count);
        Assert.Equal(0, r.Stats.FramesLost);
        Assert.Equal(3, r.Stats.DuplicateFrames);
    }

    [Fact]
    public void A_gap_across_the_wrap_is_still_a_gap()
    {
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(65530), TestFrames.Mark(2)));

        Assert.Equal(7, r.Stats.FramesLost);
        Assert.Equal(0, r.Stats.Restarts);
    }

    [Fact]
    public void A_restart_whose_configuration_was_cut_away_is_a_restart_not_65000_lost()
    {
        // Power cut at frame 2861; the next power-up's frame 0 merged into the cut frame.
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(2860), TestFrames.Mark(1, 5_000), TestFrames.Mark(2, 6_000)));

        Assert.Equal(1, r.Stats.Restarts);
        Assert.Equal(0, r.Stats.FramesLost);
        Assert.Equal(3, r.Frames.Count);
    }

    [Fact]
    public void A_power_up_frame_is_a_restart_wherever_its_number_falls()
    {
        byte[] powerUp = TestFrames.Encode(FrameType.PowerUp, 0, 0x00);
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(3), powerUp, TestFrames.Mark(1)));

        Assert.Equal(1, r.Stats.Restarts);
        Assert.Equal(0, r.Stats.FramesLost);
        Assert.Equal(0, r.Stats.UnknownFrameTypes);
    }

    [Fact]
    public void The_same_number_with_other_content_is_a_break_not_a_duplicate()
    {
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(500, 1_000), TestFrames.Mark(500, 2_000), TestFrames.Mark(501)));

        Assert.Equal(3, r.Frames.Count);
        Assert.Equal(0, r.Stats.DuplicateFrames);
        Assert.Equal(1, r.Stats.SequenceBreaks);
        Assert.Equal(0, r.Stats.FramesLost);
    }

    [Fact]
    public void A_joined_log_far_back_in_numbering_is_a_break()
    {
        TestFrames.ReadResult r = TestFrames.ReadWhole(TestFrames.Concat(TestFrames.Mark(40_000), TestFrames.Mark(12_000), TestFrames.Mark(12_001)));

        Assert.Equal(1, r.Stats.SequenceBreaks);
        Assert.Equal(0, r.Stats.FramesLost);
    }
}
