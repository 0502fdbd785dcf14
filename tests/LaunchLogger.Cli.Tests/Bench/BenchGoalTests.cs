using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>A goal judged on pooled seeds is judged on the runs of every seed put together: the
/// p95 of the concatenated error table, by nearest rank (the ⌈0.95·n⌉-th smallest |error|; Hyndman
/// and Fan 1996, The American Statistician 50, 361–365, definition 1 — from memory), worked by hand.</summary>
public class BenchGoalTests
{
    private static CaseOutcome Run(int seed, int index, double? rolloutErrorMs)
    {
        int n = BenchFigure.All.Count;
        var ours = new double?[n];
        var sigmas = new double?[n];
        ours[BenchFigure.Rollout] = rolloutErrorMs / 1000;
        sigmas[BenchFigure.Rollout] = 0.002;
        return new CaseOutcome(index, "a run", BenchGroup.GeneratedLongIdle, ours, new double?[n], sigmas, null) { Seed = seed };
    }

    [Fact]
    public void The_pooled_p95_is_the_p95_of_every_seed_s_runs_together()
    {
        // Seed 1: |errors| 0.4, 2.38 (its largest of 3: its p95), 1.1 ms. Seed 2: 19 runs of 0.1 to
        // 1.9 ms by 0.1 (its p95: the ⌈18.05⌉ = 19th, 1.9 ms). Pooled, 22 runs: the ⌈20.9⌉ = 21st
        // smallest. Sorted: 0.1, 0.2, 0.3, 0.4, 0.4 (1st–5th), 0.5 … 1.1, 1.1 (6th–13th), 1.2 … 1.9
        // (14th–21st), 2.38 (22nd): the 21st is 1.9 ms, met where seed 1 alone missed.
        var seed1 = new[] { Run(1, 0, 0.4), Run(1, 1, -2.38), Run(1, 2, 1.1) };
        var seed2 = Enumerable.Range(1, 19).Select(i => Run(2, i, (i % 2 == 0 ? -1 : 1) * i / 10.0)).ToList();
        BenchGoal rollout = BenchGoal.Of(BenchGroup.GeneratedLongIdle, calibratedTyre: false).Single(g => g.Figure == BenchFigure.Rollout);

        (double p1, int n1) = rollout.P95Of(seed1);
        (double p2, int n2) = rollout.P95Of(seed2);
        (double pooled, int n) = rollout.P95Of(seed1.Concat(seed2));

        Assert.Equal((2.38, 3), (Math.Round(p1, 9), n1));
        Assert.Equal((1.9, 19), (Math.Round(p2, 9), n2));
        Assert.Equal(22, n);
        Assert.Equal(1.9, pooled, 9);
        Assert.Equal(2, rollout.Limit);
    }

    [Fact]
    public void Runs_without_the_figure_do_not_count()
    {
        BenchGoal rollout = BenchGoal.Of(BenchGroup.GeneratedStanding, calibratedTyre: false).Single(g => g.Figure == BenchFigure.Rollout);

        (double p95, int n) = rollout.P95Of([Run(1, 0, null), Run(1, 1, 0.7)]);

        Assert.Equal(1, n);
        Assert.Equal(0.7, p95, 9);
        Assert.True(double.IsNaN(rollout.P95Of([Run(1, 0, null)]).P95));
    }

    /// <summary>The goals: first motion 5 ms and rollout 2 ms for every undriven pickup
    /// with an accelerometer; 0-60 mph, ET (5 ms) and trap speed (0.05 m/s) only with a calibrated
    /// tyre; 1.5× at 0.75–1.5 ms polls.</summary>
    [Fact]
    public void The_tyre_bound_goals_come_only_with_a_calibrated_tyre()
    {
        Assert.Equal([BenchFigure.FirstMotion, BenchFigure.Rollout], BenchGoal.Of(BenchGroup.GeneratedStanding, false).Select(g => g.Figure));
        Assert.Equal(6, BenchGoal.Of(BenchGroup.GeneratedStanding, true).Count);
        Assert.Equal([7.5, 3, 7.5, 7.5, 7.5, 0.075], BenchGoal.Of(BenchGroup.SimulatedAccelUndrivenPoll1Ms, true).Select(g => Math.Round(g.Limit, 9)));
        Assert.Empty(BenchGoal.Of(BenchGroup.SimulatedPulsesDriven, true));
        Assert.True(BenchGoal.HasTyreBoundGoals(BenchGroup.GeneratedLongIdle));
        Assert.False(BenchGoal.HasTyreBoundGoals(BenchGroup.GeneratedRolling));
    }
}
