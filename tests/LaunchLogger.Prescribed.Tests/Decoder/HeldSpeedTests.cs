using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A launch at a steady 3 m/s² to exactly 50 mph, held there 2 s, then a stop: the
/// 30-50 mph interval ends on a flat speed, where no measurement can place the crossing (the
/// generator's own truth times it at the moment the pull ends). The decoder declines it and says
/// why; 0-30 mph, clearly passed, is timed as usual.</summary>
public class HeldSpeedTests
{
    [Fact]
    public void An_interval_ending_at_a_held_speed_is_not_timed_and_the_report_says_why()
    {
        const double Accel = 3;
        var b = new MotionProfileBuilder().Hold(3).Constant(50 * TruthUnits.MpsPerMph / Accel, Accel).Hold(2).BrakeToStop(0.3, 6).Hold(3);
        PrescribedRecordSpec spec = Records.Standing(2) with { Shape = new Shape("held at 50 mph", ShapeKind.StandingStart, b.Build()) };
        PrescribedRecord record = spec.Generate();
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs);

        IntervalFigure passing = run.Figures.SpeedIntervals.Single(i => i.Interval.Label == "30-50 mph");
        Assert.Null(passing.FromStandstillS);
        Assert.Contains(run.Warnings, w => w.StartsWith("30-50 mph not timed", StringComparison.Ordinal));

        // 0-30 mph: the truth is the constant acceleration's closed form, 30 mph / 3 m/s².
        IntervalFigure thirty = run.Figures.SpeedIntervals.Single(i => i.Interval.Label == "0-30 mph");
        Assert.NotNull(thirty.FromStandstillS);
        Assert.True(Math.Abs(thirty.FromStandstillS!.Value - (30 * TruthUnits.MpsPerMph / Accel)) <= Math.Max(3 * thirty.UncertaintyS!.Value, 0.002), $"0-30 mph {thirty.FromStandstillS:F4} s ± {thirty.UncertaintyS:F4}");
    }
}
