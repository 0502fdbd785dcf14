using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>The bench's verdict accounting: each count below is made by hand from the runs listed
/// in the test, so the tally is checked against a count that does not use its code.</summary>
public class VerdictTallyTests
{
    private static readonly ExpectedVerdict CleanRun = ExpectedVerdict.Clean("standing start");
    private static readonly ExpectedVerdict Rolling = ExpectedVerdict.RollingStart("opens moving");
    private static readonly ExpectedVerdict Spun = ExpectedVerdict.Wheelspin("driven wheel spun");

    private static Verdict V(params (VerdictLevel Level, string Code)[] reasons) =>
        new(reasons.Select(r => new VerdictReason(r.Level, r.Code, r.Code)).ToList());

    [Fact]
    public void A_clean_run_matches_only_a_verdict_with_no_reason()
    {
        Assert.True(CleanRun.Matches(V()));
        Assert.False(CleanRun.Matches(V((VerdictLevel.Doubtful, "rollout_marks_disagree"))));
        Assert.Equal(["rollout_marks_disagree"], CleanRun.UnexpectedCodes(V((VerdictLevel.Doubtful, "rollout_marks_disagree"))));
    }

    [Fact]
    public void A_flawed_run_needs_its_own_reason_at_its_level_and_no_other()
    {
        Assert.True(Rolling.Matches(V((VerdictLevel.Invalid, "rolling_start"))));
        // Valid: the worst error a verdict can make.
        Assert.False(Rolling.Matches(V()));
        Assert.Equal(["rolling_start"], Rolling.MissingCodes(V()));
        // The right reason with another beside it is not what the run deserved.
        Assert.False(Rolling.Matches(V((VerdictLevel.Invalid, "rolling_start"), (VerdictLevel.Doubtful, "wheelspin"))));
        // The right reason at another level: a doubtful wheelspin run called invalid is no match.
        Assert.False(Spun.Matches(V((VerdictLevel.Doubtful, "wheelspin"), (VerdictLevel.Invalid, "pulses_dropped"))));
        Assert.True(Spun.Matches(V((VerdictLevel.Doubtful, "wheelspin"))));
    }

    [Fact]
    public void Reasons_add_up_to_the_worst_level_and_allowed_codes_may_come_or_not()
    {
        ExpectedVerdict shortRun = CleanRun.And(VerdictLevel.Doubtful, "target_not_reached", "60 mph not reached");
        Assert.False(shortRun.IsClean);
        Assert.True(shortRun.Matches(V((VerdictLevel.Doubtful, "target_not_reached"))));
        Assert.False(shortRun.Matches(V()));

        ExpectedVerdict both = Rolling.And(VerdictLevel.Doubtful, "target_not_reached", "short");
        Assert.Equal(VerdictLevel.Invalid, both.Level);
        Assert.True(both.Matches(V((VerdictLevel.Invalid, "rolling_start"), (VerdictLevel.Doubtful, "target_not_reached"))));

        // A stalled loop may leave its marks; the level follows the worst reason present.
        ExpectedVerdict stalled = CleanRun.Allowing("the loop stalls", "wide_brackets", "accel_overflow");
        Assert.True(stalled.Matches(V()));
        Assert.True(stalled.Matches(V((VerdictLevel.Doubtful, "wide_brackets"))));
        Assert.False(stalled.Matches(V((VerdictLevel.Doubtful, "wheelspin"))));
        Assert.True(Rolling.Allowing("the loop stalls", "accel_overflow").Matches(V((VerdictLevel.Invalid, "rolling_start"), (VerdictLevel.Doubtful, "accel_overflow"))));
    }

    [Fact]
    public void The_tally_counts_levels_both_ways_and_names_the_reasons_of_the_unexpected()
    {
        // By hand: six runs judged, one failed (no verdict) and left out.
        // clean valid ×3 (as expected); clean doubtful rollout_marks_disagree ×2 (one with wheelspin too);
        // rolling valid ×1 (flawed called valid); rolling invalid rolling_start ×1 (as expected).
        (ExpectedVerdict?, Verdict?)[] runs =
        [
            (CleanRun, V()),
            (CleanRun, V()),
            (CleanRun, V()),
            (CleanRun, V((VerdictLevel.Doubtful, "rollout_marks_disagree"))),
            (CleanRun, V((VerdictLevel.Doubtful, "rollout_marks_disagree"), (VerdictLevel.Doubtful, "wheelspin"))),
            (Rolling, V()),
            (Rolling, V((VerdictLevel.Invalid, "rolling_start"))),
            (CleanRun, null),
        ];

        VerdictTally t = VerdictTally.Of(runs);

        Assert.Equal(7, t.Judged);
        Assert.Equal(4, t.AsExpected);
        Assert.Equal([4, 2, 1], t.ByLevel);
        Assert.Equal(5, t.Clean);
        Assert.Equal(3, t.CleanCalledValid);
        Assert.Equal(2, t.Flawed);
        Assert.Equal(1, t.FlawedCalledValid);
        Assert.Equal(
            "as expected 4 of 7 (valid 4, doubtful 2, invalid 1); not as expected: doubtful 2: rollout_marks_disagree ×2, wheelspin ×1; valid 1: no rolling_start ×1",
            t.Describe());
    }

    [Fact]
    public void Nothing_judged_is_nothing_as_expected()
    {
        VerdictTally t = VerdictTally.Of([(null, V()), (CleanRun, null)]);

        Assert.Equal(0, t.Judged);
        Assert.Equal("as expected 0 of 0 (valid 0, doubtful 0, invalid 0)", t.Describe());
    }
}
