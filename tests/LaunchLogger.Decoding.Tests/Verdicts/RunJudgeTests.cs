using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Tests.Verdicts;

/// <summary>One test (at least) per verdict reason code: each fails when its rule is removed,
/// and each rule's threshold is pinned from both sides. The clean run is judged valid.</summary>
public class RunJudgeTests
{
    private static readonly VerdictLimits Limits = VerdictLimits.Default;

    [Fact]
    public void ACleanRunIsValidWithNoReasons()
    {
        Verdict verdict = RunJudge.Judge(JudgedRun.Clean(), grade: null, bound: null);
        Assert.Equal(VerdictLevel.Valid, verdict.Level);
        Assert.Empty(verdict.Reasons);
    }

    [Fact]
    public void ARunOpenedWhileRollingIsInvalid()
    {
        RunAnalysis run = JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, staged: false));
        AssertOnly(run, "rolling_start", VerdictLevel.Invalid);
    }

    [Fact]
    public void ALogCutOffBeforeTheSummaryIsDoubtful()
    {
        AssertOnly(JudgedRun.Clean(run: r => JudgedRun.Copy(r, complete: false)), "incomplete_log", VerdictLevel.Doubtful);
    }

    [Theory]
    [InlineData(HealthCounterNames.PulseObservationsDropped, "pulses_dropped", VerdictLevel.Invalid)]
    [InlineData(HealthCounterNames.CountsWentBackwards, "counts_backwards", VerdictLevel.Doubtful)]
    [InlineData(HealthCounterNames.AccelFifoOverflows, "accel_overflow", VerdictLevel.Doubtful)]
    [InlineData(HealthCounterNames.AccelReadFailures, "accel_read_failures", VerdictLevel.Doubtful)]
    [InlineData(HealthCounterNames.FramesRefused, "frames_refused", VerdictLevel.Doubtful)]
    [InlineData(HealthCounterNames.AccelSamplesClipped, "accel_clipped", VerdictLevel.Doubtful)]
    public void EveryHealthCounterAboveZeroGivesItsReasonAndZeroGivesNone(string counter, string code, VerdictLevel level)
    {
        Verdict one = AssertOnly(JudgedRun.Clean(run: r => JudgedRun.WithHealth(r, counter, 3)), code, level);
        Assert.EndsWith("(3)", one.Reasons[0].Text);
        Assert.Empty(Judge(JudgedRun.Clean(run: r => JudgedRun.WithHealth(r, counter, 0))).Reasons);
    }

    [Fact]
    public void CountersTheJudgeDoesNotReadLeaveTheRunValid()
    {
        // The clock wrapping and the widest bracket are facts, not faults.
        var health = new Dictionary<string, long> { [HealthCounterNames.ClockWraps] = 2, [HealthCounterNames.WidestBracketMicros] = 900 };
        Assert.Equal(VerdictLevel.Valid, Judge(JudgedRun.Clean(run: r => JudgedRun.Copy(r, health: health))).Level);
    }

    [Fact]
    public void WideBracketsCountOnlyAboveTheirShare()
    {
        // 1000 pulse observations; the limit is a share of 0.02, so 20 is at it and 21 beyond.
        Assert.Equal(1000, JudgedRun.Clean().Run.Pulses.Count);
        AssertOnly(JudgedRun.Clean(run: r => JudgedRun.WithHealth(r, HealthCounterNames.WideBrackets, 21)), "wide_brackets", VerdictLevel.Doubtful);
        Assert.Empty(Judge(JudgedRun.Clean(run: r => JudgedRun.WithHealth(r, HealthCounterNames.WideBrackets, 20))).Reasons);

        // Without pulses there is no share to take.
        RunAnalysis noPulses = JudgedRun.Clean(run: r => JudgedRun.Copy(r, health: new Dictionary<string, long> { [HealthCounterNames.WideBrackets] = 5 }, pulses: []));
        Assert.DoesNotContain(Judge(noPulses).Reasons, x => x.Code == "wide_brackets");
    }

    [Fact]
    public void ALoopSteadilySlowerThanTheBoxsBracketLimitIsNoFaultButItsStallsAre()
    {
        // The box counts every bracket over its 2 ms limit as wide; a loop that polls every 5 ms
        // (jitter ±1 ms) makes all 1000 wide, which the reconstruction models: no doubt.
        PulseRecord[] steady = Enumerable.Range(1, 1000).Select(i => new PulseRecord(i, i * 0.01, (i * 0.01) + 0.005 + (0.001 * ((i % 3) - 1)))).ToArray();
        RunAnalysis slowLoop = JudgedRun.Clean(run: r => JudgedRun.Copy(r, configuration: r.Configuration with { BracketLimitS = 0.002 }, pulses: steady, health: new Dictionary<string, long> { [HealthCounterNames.WideBrackets] = 1000 }));
        Assert.Empty(Judge(slowLoop).Reasons);

        // The same loop stalling 20 ms (over 3 × its 5 ms median) in 21 of 1000 observations,
        // beyond the 2 % share: doubtful; in 20, at the share: not.
        PulseRecord[] Stalled(int n) => steady.Select((p, i) => i < n ? p with { HiS = p.LoS + 0.02 } : p).ToArray();
        RunAnalysis stalls = JudgedRun.Clean(run: r => JudgedRun.Copy(r, configuration: r.Configuration with { BracketLimitS = 0.002 }, pulses: Stalled(21), health: new Dictionary<string, long> { [HealthCounterNames.WideBrackets] = 1000 }));
        Verdict verdict = AssertOnly(stalls, "wide_brackets", VerdictLevel.Doubtful);
        Assert.StartsWith("21 of 1000", verdict.Reasons[0].Text);
        Assert.Empty(Judge(JudgedRun.Clean(run: r => JudgedRun.Copy(r, configuration: r.Configuration with { BracketLimitS = 0.002 }, pulses: Stalled(20), health: new Dictionary<string, long> { [HealthCounterNames.WideBrackets] = 1000 }))).Reasons);
    }

    [Fact]
    public void LostFramesMakeARunDoubtful()
    {
        Verdict verdict = AssertOnly(JudgedRun.Clean(run: r => JudgedRun.Copy(r, framesLost: 2)), "frames_lost", VerdictLevel.Doubtful);
        Assert.StartsWith("2 frame(s)", verdict.Reasons[0].Text);
    }

    [Fact]
    public void WheelspinCountsOnlyBeyondItsLimitSummedOverWindows()
    {
        // Two windows of 0.03 s make 0.06 s, beyond the 0.05 s limit; one alone does not.
        TimeWindow[] two = [new(2.0, 2.03), new(3.0, 3.03)];
        Verdict verdict = AssertOnly(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: two)), "wheelspin", VerdictLevel.Doubtful);
        Assert.Contains("0.06 s", verdict.Reasons[0].Text);
        Assert.Empty(Judge(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [two[0]]))).Reasons);

        // Exactly at the limit is not beyond it.
        var atLimit = new TimeWindow(2.0, 2.0 + Limits.WheelspinS);
        var limits = Limits with { WheelspinS = atLimit.EndS - atLimit.StartS };
        Assert.Empty(RunJudge.Judge(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [atLimit])), null, null, limits).Reasons);
    }

    [Fact]
    public void AWheelSlidingUnderBrakingIsNoWheelspin()
    {
        // The claim of the ABS change: a slide while braking is carried by the accelerometer and
        // does not count against the run.
        RunAnalysis run = JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, slides: [new(20.0, 22.5)]));
        Assert.Equal(VerdictLevel.Valid, Judge(run).Level);
    }

    [Fact]
    public void OnlyThePickupWheelsSpinBeforeBrakeOnsetIsWheelspin()
    {
        // A braked tyre slips (the wheel turns slower than the road): the spin finder sees the
        // wheel part from the car after brake onset, which is no wheel running off on its own.
        BrakingResult stop = JudgedRun.Stop(8, 8, 9, onsetS: 20);
        RunAnalysis braked = JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [new(20.01, 22.5)]), braking: stop);
        Assert.Equal(VerdictLevel.Valid, Judge(braked).Level);

        // A window reaching back before onset counts for its part before it: 0.04 s is within the
        // 0.05 s limit, 0.2 s is beyond it.
        Assert.Empty(Judge(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [new(19.96, 21.0)]), braking: stop)).Reasons);
        Verdict spun = AssertOnly(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [new(19.8, 21.0)]), braking: stop), "wheelspin", VerdictLevel.Doubtful);
        Assert.Contains("0.20 s", spun.Reasons[0].Text);

        // Without a stop, every window counts.
        AssertOnly(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, wheelspin: [new(20.01, 22.5)])), "wheelspin", VerdictLevel.Doubtful);
    }

    [Fact]
    public void ACalibratedGradeBeyondThreePercentIsInvalidAndBeyondOneDoubtful()
    {
        AssertOnly(JudgedRun.Clean(), "grade", VerdictLevel.Invalid, Grade(3.5, 0.2));
        AssertOnly(JudgedRun.Clean(), "grade", VerdictLevel.Invalid, Grade(-3.5, 0.2));
        AssertOnly(JudgedRun.Clean(), "grade", VerdictLevel.Doubtful, Grade(2.0, 0.5));
        AssertOnly(JudgedRun.Clean(), "grade", VerdictLevel.Doubtful, Grade(-2.0, 0.5));

        // Judged by what the grade at least is: 3.5 % ± 1 % is at least 2.5 %, so only doubtful;
        // 1.2 % ± 0.5 % may be 0.7 %, so nothing.
        AssertOnly(JudgedRun.Clean(), "grade", VerdictLevel.Doubtful, Grade(3.5, 1.0));
        Assert.Empty(RunJudge.Judge(JudgedRun.Clean(), Grade(1.2, 0.5), null).Reasons);
    }

    [Fact]
    public void AGradeExactlyAtALimitIsNotBeyondIt()
    {
        GradeEstimate g = Grade(2.0, 0);
        Assert.Empty(RunJudge.Judge(JudgedRun.Clean(), g, null, Limits with { DoubtfulGradePercent = g.Percent }).Reasons);
        GradeEstimate steep = Grade(4.0, 0);
        Verdict verdict = RunJudge.Judge(JudgedRun.Clean(), steep, null, Limits with { InvalidGradePercent = steep.Percent });
        Assert.Equal(VerdictLevel.Doubtful, verdict.Level);
    }

    [Fact]
    public void AnUncalibratedGradeIsNotJudged()
    {
        Assert.Empty(RunJudge.Judge(JudgedRun.Clean(), Grade(8.0, 0.1, calibrated: false), null).Reasons);
    }

    /// <summary>A top speed that crossed 60 mph by less than 2σ gets no 0-60 mph time
    /// (FigureCalculator's clear-pass rule); the verdict is as doubtful but must not say 60 mph
    /// was not reached, which the data cannot show either.</summary>
    [Fact]
    public void ARunThatCrossesSixtyMphByLessThanTwoSigmaSaysItWasNotClearlyReached()
    {
        RunAnalysis run = JudgedRun.Clean(topSpeedMps: 20);
        var sixty = run.Figures.SpeedIntervals.First(i => i.Interval.Label == "0-60 mph").Interval;
        RunAnalysis near = run with { Figures = run.Figures with { MaxSpeedMps = 27.0, NotClearlyReached = [(sixty, 27.0, 0.2)] } };

        Verdict verdict = AssertOnly(near, "target_not_reached", VerdictLevel.Doubtful);

        Assert.Contains("not clearly reached", verdict.Reasons[0].Text);
        Assert.Contains("60.4 mph", verdict.Reasons[0].Text); // 27.0 m/s ÷ 0.44704 = 60.40 mph (exact mph definition)
        Assert.Contains("σ 0.4 mph", verdict.Reasons[0].Text); // 0.2 m/s ÷ 0.44704 = 0.45 → 0.4
        Assert.DoesNotContain("was not reached", verdict.Reasons[0].Text);
    }

    [Fact]
    public void ARunThatStopsShortOfSixtyMphSaysSo()
    {
        Verdict verdict = AssertOnly(JudgedRun.Clean(topSpeedMps: 20), "target_not_reached", VerdictLevel.Doubtful);
        Assert.Contains("44.7 mph", verdict.Reasons[0].Text); // 20 m/s ÷ 0.44704 (exact mph definition)

        // A car that barely moved (5 m/s at most) was not trying for 60 mph.
        RunAnalysis slow = JudgedRun.Clean(topSpeedMps: 6);
        Assert.Empty(Judge(slow with { Figures = slow.Figures with { MaxSpeedMps = 5.0 } }).Reasons);
        Assert.NotEmpty(Judge(slow).Reasons);

        // Figures asked without 0-60 mph (a metric request, say) have no such target to miss.
        RunAnalysis metric = JudgedRun.Clean(topSpeedMps: 20);
        RunAnalysis noSixty = metric with { Figures = metric.Figures with { SpeedIntervals = [.. metric.Figures.SpeedIntervals.Where(i => i.Interval.Label != "0-60 mph")] } };
        Assert.Empty(Judge(noSixty).Reasons);
        Assert.Empty(RunJudge.Judge(noSixty, grade: null, bound: Bound(2.0)).Reasons); // nothing for the bound to judge
    }

    [Fact]
    public void APulselessRunIsDoubtful()
    {
        AssertOnly(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, method: ReconstructionMethod.AccelerometerOnly)), "accelerometer_only", VerdictLevel.Doubtful);
        Assert.Empty(Judge(JudgedRun.Clean(reconstruction: r => JudgedRun.Copy(r, method: ReconstructionMethod.PulsesOnly))).Reasons);
    }

    [Fact]
    public void ALaunchFasterThanTheBoundIsDoubtfulAndOneSlowerIsNot()
    {
        // 0-60 mph at 4 m/s² takes 26.8224 / 4 = 6.7056 s (kinematics).
        RunAnalysis run = JudgedRun.Clean();
        double zeroTo60 = run.Figures.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS!.Value;
        Assert.Equal(6.7056, zeroTo60, 3);
        Verdict verdict = AssertOnly(run, "beats_braking_grip", VerdictLevel.Doubtful, bound: Bound(6.9));
        Assert.Contains("brake.log run 1", verdict.Reasons[0].Text);
        // The words say why the stop was taken as at the grip limit, and that a firm stop short of
        // it sets no bound: a clean run whose flat-topped stop was only firm is not to be read as flawed.
        TractionBound plateau = new("brake.log run 1", 7.99, 3.357, 3.357 * 27.7778 / 26.8224, GripLimit.DecelerationPlateau, "the deceleration held a plateau of 7.99 m/s² (peak 8.00 m/s²)");
        string words = RunJudge.Judge(run, null, plateau with { Bound0To60S = 6.9 }).Reasons.Single().Text;
        Assert.Contains("because the deceleration held a plateau of 7.99 m/s²", words);
        Assert.Contains("short of the grip limit, the bound does not hold", words);
        Assert.Empty(RunJudge.Judge(run, null, Bound(6.5)).Reasons);
        Assert.Empty(RunJudge.Judge(run, null, Bound(zeroTo60)).Reasons); // equal is not faster
        Assert.DoesNotContain(RunJudge.Judge(JudgedRun.Clean(topSpeedMps: 26), null, Bound(20)).Reasons, r => r.Code == "beats_braking_grip"); // no 0-60 to hold
    }

    [Fact]
    public void ReasonsComeWorstFirstAndTheLevelIsTheWorst()
    {
        // incomplete_log (doubtful) is found before pulses_dropped (invalid).
        RunAnalysis run = JudgedRun.Clean(run: r => JudgedRun.Copy(r, complete: false, health: new Dictionary<string, long> { [HealthCounterNames.PulseObservationsDropped] = 1 }));
        Verdict verdict = Judge(run);
        Assert.Equal(["pulses_dropped", "incomplete_log"], verdict.Reasons.Select(r => r.Code));
        Assert.Equal(VerdictLevel.Invalid, verdict.Level);
        Assert.Equal(VerdictLevel.Doubtful, new Verdict([new(VerdictLevel.Doubtful, "x", "")]).Level);
    }

    [Fact]
    public void TheJudgeTakesTheDefaultLimitsWhenGivenNone()
    {
        RunAnalysis run = JudgedRun.Clean(run: r => JudgedRun.WithHealth(r, HealthCounterNames.WideBrackets, 21));
        Assert.Equal(Judge(run).Reasons, RunJudge.Judge(run, null, null, VerdictLimits.Default).Reasons);
        Assert.Throws<ArgumentNullException>(() => RunJudge.Judge(null!, null, null));
    }

    private static Verdict Judge(RunAnalysis run) => RunJudge.Judge(run, grade: null, bound: null);

    private static Verdict AssertOnly(RunAnalysis run, string code, VerdictLevel level, GradeEstimate? grade = null, TractionBound? bound = null)
    {
        Verdict verdict = RunJudge.Judge(run, grade, bound);
        VerdictReason reason = Assert.Single(verdict.Reasons);
        Assert.Equal(code, reason.Code);
        Assert.Equal(level, reason.Level);
        Assert.Equal(level, verdict.Level);
        Assert.False(string.IsNullOrWhiteSpace(reason.Text));
        return verdict;
    }

    private static GradeEstimate Grade(double percent, double sigmaPercent, bool calibrated = true) =>
        new(Math.Atan(percent / 100), Math.Atan(sigmaPercent / 100), calibrated);

    private static TractionBound Bound(double zeroTo60S) => new("brake.log run 1", 26.8224 / zeroTo60S, zeroTo60S, zeroTo60S * 27.7778 / 26.8224, GripLimit.WheelSlide, "test");
}
