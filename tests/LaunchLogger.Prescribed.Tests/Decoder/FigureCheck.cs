using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>One figure of the decoder against the generator's truth.</summary>
/// <param name="Name">Which figure.</param>
/// <param name="Estimate">The decoder's value (SI), or null when it reported none.</param>
/// <param name="Sigma">Its stated 1-σ.</param>
/// <param name="Truth">The exact value.</param>
/// <param name="Tolerance">The most the error may be (SI).</param>
/// <param name="Floor">Errors below this pass the σ check whatever σ says (numerical floor).</param>
public sealed record FigureCheck(string Name, double? Estimate, double? Sigma, double Truth, double Tolerance, double Floor)
{
    /// <summary>Estimate − truth.</summary>
    public double? Error => Estimate - Truth;

    /// <summary>Why the figure fails, or null when it passes: reported, within tolerance, within ±3σ.</summary>
    public string? Failure
    {
        get
        {
            if (Error is not { } e)
            {
                return $"{Name}: not reported (truth {F(Truth)})";
            }

            if (Math.Abs(e) > Tolerance)
            {
                return $"{Name}: error {F(e)} beyond the tolerance {F(Tolerance)}";
            }

            double s = Sigma ?? 0;
            return Math.Abs(e) > Math.Max(3 * s, Floor) ? $"{Name}: error {F(e)} beyond 3σ (σ {F(s)})" : null;
        }
    }

    private static string F(double v) => v.ToString("0.#####", CultureInfo.InvariantCulture);
}

/// <summary>Builds the checks of one run: the issue's goals as tolerances (first motion 5 ms,
/// rollout 2 ms, 0–60 mph and the quarter mile 5 ms, trap 0.05 m/s, passing 5 ms, stopping
/// distance 0.3 m, onset 15 ms), each widened by <c>slack</c> (1.5 for a 1 ms poll).</summary>
public static class FigureChecks
{
    private const double TimeFloorS = 2e-4;
    private const double SpeedFloorMps = 2e-3;
    private const double DistanceFloorM = 0.01;

    /// <summary>Standing-start figures: first motion, rollout, 0–60 mph and 0–100 km/h both
    /// ways, 60 ft, quarter-mile elapsed time both ways and trap speed.</summary>
    public static IEnumerable<FigureCheck> Standing(FigureSet f, TruthRun t, double slack = 1)
    {
        yield return new("first motion", f.FirstMotionS.Value, f.FirstMotionS.Sigma, t.FirstMotionS!.Value, 5e-3 * slack, TimeFloorS);
        yield return new("rollout mark", f.RolloutTimeS?.Value, f.RolloutTimeS?.Sigma, t.RolloutS!.Value, 2e-3 * slack, TimeFloorS);
        foreach (TruthSpeedSpan span in new[] { TruthSpeedSpan.Mph(0, 60), TruthSpeedSpan.Kmh(0, 100) })
        {
            if (t.Interval(span) is { FromStandstillS: { } standstill, FromRolloutS: { } rollout })
            {
                IntervalFigure? got = Interval(f, span);
                yield return new($"{Label(span)} from standstill", got?.FromStandstillS, got?.UncertaintyS, standstill, 5e-3 * slack, TimeFloorS);
                yield return new($"{Label(span)} after rollout", got?.FromRolloutS, got?.FromRolloutUncertaintyS, rollout, 5e-3 * slack, TimeFloorS);
            }
        }

        foreach (double feet in new[] { 60.0, 1320.0 })
        {
            if (t.Mark(feet * TruthUnits.MetresPerFoot) is { FromStandstillS: { } standstill, FromRolloutS: { } rollout } mark)
            {
                MarkFigure? got = f.DistanceMarks.FirstOrDefault(m => Math.Abs(m.Mark.DistanceM - mark.Span.DistanceM) < 1e-6);
                yield return new($"{feet} ft from standstill", got?.FromStandstillS, got?.UncertaintyS, standstill, 5e-3 * slack, TimeFloorS);
                yield return new($"{feet} ft after rollout", got?.FromRolloutS, got?.FromRolloutUncertaintyS, rollout, 5e-3 * slack, TimeFloorS);
                if (mark.TrapSpeedMps is { } trap)
                {
                    yield return new($"{feet} ft trap speed", got?.TrapSpeedMps, got?.TrapSpeedUncertaintyMps, trap, 0.05 * slack, SpeedFloorMps);
                }
            }
        }
    }

    /// <summary>Passing intervals the truth has (30–50, 50–70 mph, 80–120 km/h), except those
    /// ending within 2 % of the run's top speed: a crossing where the speed curve tops out moves
    /// by tens of ms for a speed error of millimetres per second (a pull cut at exactly 50 mph
    /// and held there measured 16–69 ms on 30–50 mph; the stop-and-go's second run still tops
    /// out at 70 mph, the end of 50–70 mph), so it says nothing about the timing.</summary>
    public static IEnumerable<FigureCheck> Passing(FigureSet f, TruthRun t, double slack = 1)
    {
        foreach (TruthSpeedSpan span in new[] { TruthSpeedSpan.Mph(30, 50), TruthSpeedSpan.Mph(50, 70), TruthSpeedSpan.Kmh(80, 120) }.Where(s => s.ToMps < 0.98 * t.PeakSpeedMps))
        {
            if (t.Interval(span) is { FromStandstillS: { } time })
            {
                IntervalFigure? got = Interval(f, span);
                yield return new($"{Label(span)}", got?.FromStandstillS, got?.UncertaintyS, time, 5e-3 * slack, TimeFloorS);
            }
        }
    }

    /// <summary>The stop: onset and stopping distance.</summary>
    public static IEnumerable<FigureCheck> Stop(RunAnalysis a, TruthRun t, double slack = 1)
    {
        TruthStop stop = t.Stop!;
        yield return new("brake onset", a.Braking?.OnsetS.Value, a.Braking?.OnsetS.Sigma, stop.OnsetS, 15e-3 * slack, TimeFloorS);
        yield return new("stopping distance", a.Braking?.StoppingDistanceM.Value, a.Braking?.StoppingDistanceM.Sigma, stop.StoppingDistanceM, 0.3 * slack, DistanceFloorM);
    }

    /// <summary>Fails with every failing figure listed.</summary>
    public static void AssertAll(string what, IEnumerable<FigureCheck> checks)
    {
        string[] failures = checks.Select(c => c.Failure).OfType<string>().ToArray();
        Assert.True(failures.Length == 0, $"{what}:\n  " + string.Join("\n  ", failures));
    }

    private static IntervalFigure? Interval(FigureSet f, TruthSpeedSpan span) =>
        f.SpeedIntervals.FirstOrDefault(i => Math.Abs(i.Interval.FromMps - span.FromMps) < 1e-9 && Math.Abs(i.Interval.ToMps - span.ToMps) < 1e-9);

    private static string Label(TruthSpeedSpan span) => Math.Abs(Math.Round(span.ToMps / TruthUnits.MpsPerMph) - (span.ToMps / TruthUnits.MpsPerMph)) < 1e-9
        ? string.Create(CultureInfo.InvariantCulture, $"{span.FromMps / TruthUnits.MpsPerMph:0}-{span.ToMps / TruthUnits.MpsPerMph:0} mph")
        : string.Create(CultureInfo.InvariantCulture, $"{span.FromMps * 3.6:0}-{span.ToMps * 3.6:0} km/h");
}
