namespace LaunchLogger.Cli.Bench;

/// <summary>An accuracy goal of the issue: a figure's |error| p95 within a limit over a group's runs.</summary>
/// <param name="Figure">The figure (<see cref="BenchFigure"/>'s index).</param>
/// <param name="Limit">The p95's limit, in the figure's printed unit.</param>
/// <param name="Text">The goal as the bench prints it.</param>
public sealed record BenchGoal(int Figure, double Limit, string Text)
{
    /// <summary>The p95 goals of <paramref name="group"/>, in print order; the figures that need a
    /// calibrated tyre are judged only with one (<paramref name="calibratedTyre"/>).</summary>
    public static IReadOnlyList<BenchGoal> Of(BenchGroup group, bool calibratedTyre) => group switch
    {
        BenchGroup.SimulatedAccelUndriven or BenchGroup.GeneratedStanding or BenchGroup.GeneratedLongIdle or BenchGroup.GeneratedStandingSmooth or BenchGroup.GeneratedStandingLagged
            => Accuracy(1, calibratedTyre),
        BenchGroup.SimulatedAccelUndrivenPoll1Ms => Accuracy(1.5, calibratedTyre),
        BenchGroup.GeneratedRolling =>
        [
            new(BenchFigure.Passing30To50, 5, "30-50 mph p95 ≤ 5 ms"),
            new(BenchFigure.Passing80To120, 5, "80-120 km/h p95 ≤ 5 ms"),
        ],
        BenchGroup.GeneratedCruiseStop or BenchGroup.GeneratedCruiseStopSwitch =>
        [
            new(BenchFigure.StoppingDistance, 0.3, "stopping distance p95 ≤ 0.3 m"),
            new(BenchFigure.BrakeOnset, 15, "brake onset p95 ≤ 15 ms (rise times up to 2 s)"),
        ],
        _ => [],
    };

    /// <summary>The nearest-rank p95 of the figure's |error| over <paramref name="runs"/>, in the
    /// figure's unit, and how many runs have it (NaN and 0 when none).</summary>
    public (double P95, int Runs) P95Of(IEnumerable<CaseOutcome> runs)
    {
        double[] sorted = ErrorsOf(runs);
        return (Percentiles.Of(sorted, 0.95), sorted.Length);
    }

    /// <summary>The figure's |error| over <paramref name="runs"/>, in its unit, ascending.</summary>
    public double[] ErrorsOf(IEnumerable<CaseOutcome> runs)
    {
        ArgumentNullException.ThrowIfNull(runs);
        return Percentiles.AbsSorted(runs.Select(o => o.Ours[Figure]), BenchFigure.All[Figure].Scale);
    }

    /// <summary>The p95's verdict against the limit (met / NOT met, as the single-seed bench says
    /// it) and where the p95's distribution-free interval (<paramref name="interval"/>,
    /// <see cref="QuantileInterval"/>) lies against the limit.</summary>
    public string Verdict(double p95, QuantileInterval.Bracket interval)
    {
        ArgumentNullException.ThrowIfNull(interval);
        return (p95 <= Limit, interval.Against(Limit)) switch
        {
            (true, QuantileInterval.GoalSide.WhollyWithin) => "met, interval wholly within",
            (true, _) => "met; the goal lies inside the interval",
            (false, QuantileInterval.GoalSide.WhollyOutside) => "NOT met, interval wholly outside",
            (false, _) => "NOT met; the goal lies inside the interval",
        };
    }

    /// <summary>True when <paramref name="group"/> has the accuracy goals for an undriven
    /// pickup with an accelerometer, whose tyre-bound goals need a calibrated tyre.</summary>
    public static bool HasTyreBoundGoals(BenchGroup group) => group is BenchGroup.SimulatedAccelUndriven or BenchGroup.SimulatedAccelUndrivenPoll1Ms
        or BenchGroup.GeneratedStanding or BenchGroup.GeneratedLongIdle or BenchGroup.GeneratedStandingSmooth or BenchGroup.GeneratedStandingLagged;

    /// <summary>The accuracy goals for an undriven pickup with an accelerometer, widened
    /// by <paramref name="factor"/>.</summary>
    private static BenchGoal[] Accuracy(double factor, bool calibratedTyre)
    {
        string times = factor == 1 ? "" : FormattableString.Invariant($" ({factor:0.0}× the goal)");
        BenchGoal[] launch =
        [
            new(BenchFigure.FirstMotion, 5 * factor, FormattableString.Invariant($"first motion p95 ≤ {5 * factor:0.###} ms{times}")),
            new(BenchFigure.Rollout, 2 * factor, FormattableString.Invariant($"rollout mark p95 ≤ {2 * factor:0.###} ms{times}")),
        ];
        return !calibratedTyre ? launch :
        [
            .. launch,
            new(BenchFigure.ZeroTo60, 5 * factor, FormattableString.Invariant($"0-60 mph from standstill p95 ≤ {5 * factor:0.###} ms")),
            new(BenchFigure.ZeroTo60AfterRollout, 5 * factor, FormattableString.Invariant($"0-60 mph after rollout p95 ≤ {5 * factor:0.###} ms")),
            new(BenchFigure.Quarter, 5 * factor, FormattableString.Invariant($"1/4 mile ET p95 ≤ {5 * factor:0.###} ms")),
            new(BenchFigure.Trap, 0.05 * factor, FormattableString.Invariant($"1/4 mile trap speed p95 ≤ {0.05 * factor:0.###} m/s")),
        ];
    }

}
