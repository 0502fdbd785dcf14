using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Cli.Bench;

/// <summary>Reads the benchmark's figures from the decoder's figure sets and from the
/// generator's truth.</summary>
public static class FigureReading
{
    private static readonly double QuarterMileM = 1320 * Units.MetresPerFoot;

    /// <summary>The figures of a figure set (ours, the naive method's or the simulator's truth)
    /// and, when given, a stop and the grade at staging, each with the σ the report prints beside it.
    /// A run that opened moving (<paramref name="standing"/> false) has no first motion, as its
    /// report says (<c>first_motion_s</c> null, verdict reason <c>rolling_start</c>): its figure
    /// set's first motion is only where its distances start counting (the first pulse), so it is
    /// not read as one.</summary>
    public static FigureValues FromFigures(FigureSet f, BrakingResult? braking = null, GradeEstimate? grade = null, bool standing = true)
    {
        IntervalFigure? i60 = Interval(f, SpeedInterval.Mph(0, 60));
        MarkFigure? quarter = Mark(f, QuarterMileM);
        IntervalFigure? p3050 = Interval(f, SpeedInterval.Mph(30, 50));
        IntervalFigure? p80120 = Interval(f, SpeedInterval.Kmh(80, 120));
        FigureValues values = new FigureValues()
            .Set(BenchFigure.FirstMotion, standing ? f.FirstMotionS.Value : null, standing ? f.FirstMotionS.Sigma : null)
            .Set(BenchFigure.Rollout, f.RolloutTimeS?.Value, f.RolloutTimeS?.Sigma)
            .Set(BenchFigure.ZeroTo60, i60?.FromStandstillS, i60?.UncertaintyS)
            .Set(BenchFigure.ZeroTo60AfterRollout, i60?.FromRolloutS, i60?.FromRolloutUncertaintyS)
            .Set(BenchFigure.Quarter, quarter?.FromStandstillS, quarter?.UncertaintyS)
            .Set(BenchFigure.QuarterAfterRollout, quarter?.FromRolloutS, quarter?.FromRolloutUncertaintyS)
            .Set(BenchFigure.Trap, quarter?.TrapSpeedMps, quarter?.TrapSpeedUncertaintyMps)
            .Set(BenchFigure.Passing30To50, p3050?.FromStandstillS, p3050?.UncertaintyS)
            .Set(BenchFigure.Passing80To120, p80120?.FromStandstillS, p80120?.UncertaintyS)
            .Set(BenchFigure.StoppingDistance, braking?.StoppingDistanceM.Value, braking?.StoppingDistanceM.Sigma)
            .Set(BenchFigure.BrakeOnset, braking?.OnsetS.Value, braking?.OnsetS.Sigma)
            .Set(BenchFigure.RolloutAfterFirstMotion, f.RolloutAfterFirstMotionS?.Value, f.RolloutAfterFirstMotionS?.Sigma)
            .Set(BenchFigure.RolloutSpeed, f.RolloutSpeedMps?.Value, f.RolloutSpeedMps?.Sigma)
            .Set(BenchFigure.Grade, grade?.Percent, grade is null ? null : Math.Tan(grade.SigmaRad) * 100);
        for (int m = BenchFigure.FirstOfStandardSet; m < BenchFigure.All.Count; m++)
        {
            BenchFigure figure = BenchFigure.All[m];
            if (figure.Interval is { } wanted && Interval(f, wanted) is { } i)
            {
                _ = figure.Convention == FigureConvention.AfterRollout
                    ? values.Set(m, i.FromRolloutS, i.FromRolloutUncertaintyS)
                    : values.Set(m, i.FromStandstillS, i.UncertaintyS);
            }
            else if (figure.Mark is { } mark && Mark(f, mark.DistanceM) is { } k)
            {
                _ = figure.Convention switch
                {
                    FigureConvention.AfterRollout => values.Set(m, k.FromRolloutS, k.FromRolloutUncertaintyS),
                    FigureConvention.TrapSpeed => values.Set(m, k.TrapSpeedMps, k.TrapSpeedUncertaintyMps),
                    _ => values.Set(m, k.FromStandstillS, k.UncertaintyS),
                };
            }
        }

        return values;
    }

    /// <summary>The exact figures of one generated run on a road of <paramref name="gradeRad"/>.</summary>
    public static FigureValues FromTruth(TruthRun t, double gradeRad = 0)
    {
        TruthInterval? i60 = t.Interval(TruthSpeedSpan.Mph(0, 60));
        TruthMark? quarter = t.Mark(QuarterMileM);
        FigureValues values = new FigureValues()
            .Set(BenchFigure.FirstMotion, t.FirstMotionS)
            .Set(BenchFigure.Rollout, t.RolloutS)
            .Set(BenchFigure.ZeroTo60, i60?.FromStandstillS)
            .Set(BenchFigure.ZeroTo60AfterRollout, i60?.FromRolloutS)
            .Set(BenchFigure.Quarter, quarter?.FromStandstillS)
            .Set(BenchFigure.QuarterAfterRollout, quarter?.FromRolloutS)
            .Set(BenchFigure.Trap, quarter?.TrapSpeedMps)
            .Set(BenchFigure.Passing30To50, t.Interval(TruthSpeedSpan.Mph(30, 50))?.FromStandstillS)
            .Set(BenchFigure.Passing80To120, t.Interval(TruthSpeedSpan.Kmh(80, 120))?.FromStandstillS)
            .Set(BenchFigure.StoppingDistance, t.Stop?.StoppingDistanceM)
            .Set(BenchFigure.BrakeOnset, t.Stop?.OnsetS)
            .Set(BenchFigure.RolloutAfterFirstMotion, t.RolloutS - t.FirstMotionS)
            .Set(BenchFigure.RolloutSpeed, t.RolloutSpeedMps)
            .Set(BenchFigure.Grade, t.Standing ? Math.Tan(gradeRad) * 100 : null);
        for (int m = BenchFigure.FirstOfStandardSet; m < BenchFigure.All.Count; m++)
        {
            BenchFigure figure = BenchFigure.All[m];
            if (figure.Interval is { } wanted && t.Interval(new TruthSpeedSpan(wanted.FromMps, wanted.ToMps)) is { } i)
            {
                values.Set(m, figure.Convention == FigureConvention.AfterRollout ? i.FromRolloutS : i.FromStandstillS);
            }
            else if (figure.Mark is { } mark && t.Mark(mark.DistanceM) is { } k)
            {
                values.Set(m, figure.Convention switch
                {
                    FigureConvention.AfterRollout => k.FromRolloutS,
                    FigureConvention.TrapSpeed => k.TrapSpeedMps,
                    _ => k.FromStandstillS,
                });
            }
        }

        return values;
    }

    /// <summary>True when <paramref name="f"/> reports any figure from standstill (a speed
    /// interval from 0 or a distance mark).</summary>
    public static bool HasStandingFigure(FigureSet f) =>
        f.SpeedIntervals.Any(i => i.Interval.IsStanding && i.FromStandstillS is not null)
        || f.DistanceMarks.Any(m => m.FromStandstillS is not null);

    private static IntervalFigure? Interval(FigureSet f, SpeedInterval wanted) =>
        f.SpeedIntervals.FirstOrDefault(i => Math.Abs(i.Interval.FromMps - wanted.FromMps) < 1e-9 && Math.Abs(i.Interval.ToMps - wanted.ToMps) < 1e-9);

    private static MarkFigure? Mark(FigureSet f, double distanceM) =>
        f.DistanceMarks.FirstOrDefault(m => Math.Abs(m.Mark.DistanceM - distanceM) < 1e-6);
}
