using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>Which verdict a run deserves when its top speed is near 60 mph: the generator's
/// launches to a chosen top speed (an independent truth), decoded, against the expectation.</summary>
public class TargetEdgeTests
{
    private const double Mph = 0.44704; // exact: 1 mph = 1609.344 m / 3600 s (NIST SP 811, from memory)
    private const double G = 9.80665;

    /// <summary>A standing launch at 0.35 g to <paramref name="topMph"/>, braking at once: the
    /// truth's top speed is the one asked for.</summary>
    private static CaseOutcome Launch(double topMph, int seed = 7)
    {
        var spec = new PrescribedRecordSpec { Shape = PrescribedShapes.LaunchThenStop(0.35 * G, topMph * Mph, 0.3), Seed = seed };
        var c = new PrescribedBenchCase(0, spec, BenchGroup.GeneratedStanding, AsLog: true, $"launch to {topMph} mph");
        return PrescribedBenchmark.Run(c, default).Single();
    }

    [Fact]
    public void Only_the_edge_makes_a_run_either_way_and_a_stall_allowance_leaves_it_clean()
    {
        ExpectedVerdict clean = ExpectedVerdict.Clean("standing start, sane sensors");
        ExpectedVerdict stalled = clean.Allowing("the loop stalls 20 ms", "wide_brackets", "accel_overflow");
        ExpectedVerdict edge = clean.AtTargetEdge(TargetEdge.TargetMps + 0.1, 0.2);

        Assert.True(stalled.IsClean);
        Assert.False(stalled.EitherWay);
        Assert.False(edge.IsClean);
        Assert.True(edge.EitherWay);
        Assert.Contains(ExpectedVerdict.TargetNotReachedCode, edge.Allowed);
    }

    [Fact]
    public void The_band_lies_above_the_target_only_and_is_four_sigma_wide()
    {
        double target = TargetEdge.TargetMps;
        Assert.Equal(26.8224, target, 12); // 60 × 0.44704 m/s, exact

        Assert.Equal(4, TargetEdge.BandSigmas);
        Assert.True(TargetEdge.EitherVerdict(target, 0.2));
        Assert.True(TargetEdge.EitherVerdict(target + 0.79, 0.2));
        Assert.False(TargetEdge.EitherVerdict(target + 0.81, 0.2));
        // Under the target the figure does not exist: only doubtful is right.
        Assert.False(TargetEdge.EitherVerdict(target - 0.01, 0.2));
        // Without a speed σ the data's resolution is unknown: the strict expectation stands.
        Assert.False(TargetEdge.EitherVerdict(target + 0.1, null));
        Assert.False(TargetEdge.EitherVerdict(target + 0.1, 0));
    }

    [Fact]
    public void A_run_just_over_60_mph_deserves_either_verdict_and_is_counted_apart()
    {
        CaseOutcome edge = Launch(60.05);

        Assert.Null(edge.Failure);
        ExpectedVerdict expected = edge.Expected!;
        Assert.True(expected.EitherWay, expected.Why);
        Assert.False(expected.IsClean);
        Assert.True(expected.Matches(edge.Verdict!), string.Join(",", edge.Verdict!.Reasons.Select(r => r.Code)));
        Assert.True(expected.Matches(new Verdict([])));
        Assert.True(expected.Matches(new Verdict([new VerdictReason(VerdictLevel.Doubtful, ExpectedVerdict.TargetNotReachedCode, "not clearly reached")])));
        Assert.False(expected.Matches(new Verdict([new VerdictReason(VerdictLevel.Doubtful, ExpectedVerdict.WheelspinCode, "spun")])));

        VerdictTally tally = VerdictTally.Of([(expected, edge.Verdict)]);
        Assert.Equal((0, 0, 1), (tally.Clean, tally.Flawed, tally.EitherWay));
    }

    [Fact]
    public void A_run_that_stops_short_of_60_mph_still_deserves_doubtful_only()
    {
        CaseOutcome shortRun = Launch(59.0);

        Assert.Null(shortRun.Failure);
        Assert.Equal(VerdictLevel.Doubtful, shortRun.Expected!.Level);
        Assert.Equal([ExpectedVerdict.TargetNotReachedCode], shortRun.Expected.Codes);
        Assert.False(shortRun.Expected.EitherWay);
        Assert.True(shortRun.Expected.Matches(shortRun.Verdict!), string.Join(",", shortRun.Verdict!.Reasons.Select(r => r.Code)));
    }

    [Fact]
    public void A_run_well_past_60_mph_deserves_valid_only()
    {
        CaseOutcome clear = Launch(66);

        Assert.Null(clear.Failure);
        Assert.True(clear.Expected!.IsClean, clear.Expected.Why);
        Assert.Equal(VerdictLevel.Valid, clear.Verdict!.Level);
    }
}
