using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Verdicts;

/// <summary>Decides whether a run's figures can be quoted, and says why not.</summary>
public static class RunJudge
{
    /// <summary>Judges one analysed run.</summary>
    /// <param name="analysis">The run.</param>
    /// <param name="grade">Its grade, when known.</param>
    /// <param name="bound">A braking bound to hold its acceleration against, when one is known.</param>
    /// <param name="limits">Thresholds; <see cref="VerdictLimits.Default"/> when null.</param>
    public static Verdict Judge(RunAnalysis analysis, GradeEstimate? grade, TractionBound? bound, VerdictLimits? limits = null) =>
        Finish(OwnReasons(analysis, grade, limits), analysis.Figures, bound);

    /// <summary>The reasons found in the run itself, in the order found: everything but the
    /// session's braking bound, which may come from a later run.</summary>
    /// <param name="analysis">The run.</param>
    /// <param name="grade">Its grade, when known.</param>
    /// <param name="limits">Thresholds; <see cref="VerdictLimits.Default"/> when null.</param>
    public static List<VerdictReason> OwnReasons(RunAnalysis analysis, GradeEstimate? grade, VerdictLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        limits ??= VerdictLimits.Default;
        var reasons = new List<VerdictReason>();
        DecodedRun run = analysis.Run;
        ReconstructedRun rec = analysis.Reconstruction;
        FigureSet figures = analysis.Figures;

        if (!rec.Staged)
        {
            reasons.Add(new(VerdictLevel.Invalid, "rolling_start", "the run opened while already rolling: standing-start figures have no true standstill"));
        }

        if (!run.Complete)
        {
            reasons.Add(new(VerdictLevel.Doubtful, "incomplete_log", "the log ends before the run's summary (power loss or cut-off)"));
        }

        Count(HealthCounterNames.PulseObservationsDropped, VerdictLevel.Invalid, "pulses_dropped", "pulse observations were dropped by the box: distance is missing pulses");
        Count(HealthCounterNames.CountsWentBackwards, VerdictLevel.Doubtful, "counts_backwards", "the pulse counter went backwards (wiring or counter fault)");
        Count(HealthCounterNames.AccelFifoOverflows, VerdictLevel.Doubtful, "accel_overflow", "the accelerometer's FIFO overflowed: samples are missing");
        Count(HealthCounterNames.AccelReadFailures, VerdictLevel.Doubtful, "accel_read_failures", "accelerometer reads failed");
        Count(HealthCounterNames.FramesRefused, VerdictLevel.Doubtful, "frames_refused", "the box's storage or serial link refused frames");
        Count(HealthCounterNames.AccelSamplesClipped, VerdictLevel.Doubtful, "accel_clipped", "accelerometer samples reached full scale (clipped)");

        if (WideBrackets(run, limits) is { } wide && run.Pulses.Count > 0
            && (double)wide / run.Pulses.Count > limits.WideBracketFraction)
        {
            reasons.Add(new(VerdictLevel.Doubtful, "wide_brackets", Invariant($"{wide} of {run.Pulses.Count} pulse observations have wide time brackets")));
        }

        if (run.FramesLost > 0)
        {
            reasons.Add(new(VerdictLevel.Doubtful, "frames_lost", Invariant($"{run.FramesLost} frame(s) of this run were lost or damaged in the log")));
        }

        // A wheel sliding under braking (ABS at work, or a braked tyre's slip, which the spin
        // finder sees as the wheel parting from the car) is expected and carried by the
        // accelerometer; only a wheel running off on its own before the brakes come on counts
        // against the run, and only past what a tyre slips at its grip peak (a clean hard launch
        // runs its driven wheel up to that far ahead). Spin at the launch (the pulses kept) counts
        // with it, once where both saw it.
        double driveEndsS = analysis.Braking?.OnsetS.Value ?? double.PositiveInfinity;
        // With pulses alone, the wheel's own run-up or fall-back past what a car can do with its
        // tyre at or below its grip peak (PulseSpinBound) counts the same way.
        double spin = WheelspinDetector.Union([.. rec.SpinPastPeakWindows, .. rec.LaunchSpinWindows, .. rec.PulseSpinWindows]).Sum(w => Math.Max(0, Math.Min(w.EndS, driveEndsS) - w.StartS));
        if (spin > limits.WheelspinS)
        {
            string where = rec.PulseSpinWindows.Count > 0
                ? "with pulses alone, the wheel's speed ran up or fell back at the launch faster than a car can move it with its tyre at or below its grip peak, and the launch marks may read early"
                : rec.LaunchSpinWindows.Count == 0
                ? "distance and speed there lean on the accelerometer"
                : "at the launch the pulses ran ahead of the car by more than a tyre slips at its grip peak, and the launch marks may read early";
            reasons.Add(new(VerdictLevel.Doubtful, "wheelspin", Invariant($"the pickup wheel's speed parted from the car's (spin or slide) for {spin:0.00} s: {where}")));
        }
        else if (rec.SlipSwing is { Swings: true } swing && rec.DrivenWheel)
        {
            // A slip that swings to and fro through the launch crosses the tyre's grip peak
            // (SlipSwingTest): the wheel runs ahead in bursts no slip threshold sees. Only on a
            // wheel taken as driven (ReconstructedRun.DrivenWheel: told so, or its slip found
            // above an undriven wheel's, kept or not): an undriven wheel passes no drive force and
            // has no peak to cross.
            string beyond = swing.SwingsByBlocks
                ? Invariant($"{swing.Swinging} of {swing.Blocks} blocks of {SlipSwingTest.BlockS:0.0} s beyond what its teeth and edges explain")
                : Invariant($"χ² {swing.ChiSquare:0} on {swing.DegreesOfFreedom:0} degrees of freedom over its {swing.Blocks} block{(swing.Blocks == 1 ? "" : "s")} of {SlipSwingTest.BlockS:0.0} s, beyond what its teeth and edges explain");
            reasons.Add(new(VerdictLevel.Doubtful, "wheelspin", Invariant($"the driven wheel's slip swung to and fro through the launch ({beyond}): a tyre crossing its grip peak, and the launch marks lean on pulses that ran ahead in bursts")));
        }

        if (grade is { MountingCalibrated: true } g)
        {
            // Judge the grade by what it at least is (|grade| − 1σ), so noise alone never condemns a run.
            double pct = Math.Abs(g.Percent);
            double sigmaPct = Math.Tan(g.SigmaRad) * 100;
            double atLeast = pct - sigmaPct;
            string where = Invariant($"grade {g.Percent:+0.0;-0.0} % (± {sigmaPct:0.0} %)");
            if (atLeast > limits.InvalidGradePercent)
            {
                reasons.Add(new(VerdictLevel.Invalid, "grade", $"{where} is beyond {limits.InvalidGradePercent.ToString(CultureInfo.InvariantCulture)} %"));
            }
            else if (atLeast > limits.DoubtfulGradePercent)
            {
                reasons.Add(new(VerdictLevel.Doubtful, "grade", $"{where} is beyond {limits.DoubtfulGradePercent.ToString(CultureInfo.InvariantCulture)} %: quote the level-corrected figures or pair with a run the other way"));
            }
        }

        // A rolling start has no 0-60 by nature: rolling_start already says why. A top speed that
        // crossed 60 mph by less than 2σ (FigureCalculator.ClearPassSigmas) is as doubtful, but
        // "not reached" would be untrue of it: the data cannot show it either way.
        if (rec.Staged && figures.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == "0-60 mph") is { FromStandstillS: null } && figures.MaxSpeedMps > 5)
        {
            string text = figures.NotClearlyReached.FirstOrDefault(d => d.Interval.Label == "0-60 mph") is { Interval: not null } near
                ? Invariant($"60 mph not clearly reached: the top speed, {near.TopMps / Units.MpsPerMph:0.0} mph, is within {FigureCalculator.ClearPassSigmas:0}σ (σ {near.SigmaMps / Units.MpsPerMph:0.0} mph) of it, so the data cannot show 60 mph was passed")
                : Invariant($"60 mph was not reached (top speed {figures.MaxSpeedMps / Units.MpsPerMph:0.0} mph)");
            reasons.Add(new(VerdictLevel.Doubtful, "target_not_reached", text));
        }

        if (run.FirmwareRolloutS is { } boxMark && figures.RolloutTimeS is not null
            && RolloutMarkWindow.For(analysis, limits) is { } window && !window.Contains(boxMark))
        {
            double nearest = boxMark < window.StartS ? window.StartS : window.EndS;
            reasons.Add(new(VerdictLevel.Doubtful, "rollout_marks_disagree", Invariant($"the box's rollout mark is {(boxMark - nearest) * 1000:+0.0;-0.0} ms outside the {window.StartS - figures.FirstMotionS.Value:0.000}–{window.EndS - figures.FirstMotionS.Value:0.000} s (after first motion) its pulse spacing and wheel slip allow")));
        }

        if (rec.Method == ReconstructionMethod.AccelerometerOnly)
        {
            reasons.Add(new(VerdictLevel.Doubtful, "accelerometer_only", "no pulses: distance and speed come from the accelerometer alone and drift"));
        }

        return reasons;

        void Count(string name, VerdictLevel level, string code, string text)
        {
            if (run.Health.TryGetValue(name, out long n) && n > 0)
            {
                reasons.Add(new(level, code, Invariant($"{text} ({n})")));
            }
        }
    }

    /// <summary>Pulse observations whose time brackets are wide, or null when none is counted.
    /// The box counts brackets wider than its limit; a loop steadily slower than that limit (its
    /// median bracket more than <see cref="VerdictLimits.WideBracketOverMedian"/> times short of
    /// it) makes every bracket "wide", which the reconstruction models and σ carries: then only
    /// brackets that stand out from the run's own loop (a stall) are wide. Without a known limit
    /// the box's count stands.</summary>
    private static long? WideBrackets(DecodedRun run, VerdictLimits limits)
    {
        long? counted = run.Health.TryGetValue(HealthCounterNames.WideBrackets, out long n) ? n : null;
        if (counted is null or 0 || run.Pulses.Count == 0)
        {
            return counted;
        }

        double[] widths = run.Pulses.Select(p => p.HiS - p.LoS).Order().ToArray();
        double medianS = widths[widths.Length / 2];
        double steadyS = limits.WideBracketOverMedian * medianS;
        double limitS = run.Configuration.BracketLimitS;
        return limitS <= 0 || steadyS <= limitS ? counted : widths.LongCount(w => w > steadyS);
    }

    /// <summary>The verdict from a run's own reasons (<see cref="OwnReasons"/>) and the session's
    /// braking bound, most serious reason first.</summary>
    /// <param name="ownReasons">The run's own reasons.</param>
    /// <param name="figures">Its figures.</param>
    /// <param name="bound">A braking bound to hold its acceleration against, when one is known.</param>
    public static Verdict Finish(IEnumerable<VerdictReason> ownReasons, FigureSet figures, TractionBound? bound)
    {
        ArgumentNullException.ThrowIfNull(ownReasons);
        ArgumentNullException.ThrowIfNull(figures);
        var reasons = new List<VerdictReason>(ownReasons);
        if (bound is { } b && figures.SpeedIntervals.FirstOrDefault(i => i.Interval.Label == "0-60 mph")?.FromStandstillS is { } zeroTo60 && zeroTo60 < b.Bound0To60S)
        {
            reasons.Add(new(VerdictLevel.Doubtful, "beats_braking_grip", Invariant($"0-60 mph in {zeroTo60:0.000} s is faster than the braking grip allows ({b.Bound0To60S:0.000} s from {b.Source}, taken as a stop at the grip limit because {b.Why}): check calibration, slope, wheel size; if that stop was firm but short of the grip limit, the bound does not hold (name a stop at the limit with --brake-reference)")));
        }

        reasons.Sort((x, y) => y.Level.CompareTo(x.Level));
        return new Verdict(reasons);
    }

    private static string Invariant(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
