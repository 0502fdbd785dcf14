using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Tests.Verdicts;

/// <summary>Only a stop at the grip limit bounds a launch.</summary>
public class GripLimitTests
{
    private const double G = 9.80665; // standard gravity (CGPM 1901, exact)

    [Fact]
    public void AGentleStopBoundsNothing()
    {
        // 0.5 g held flat: the driver's demand, not the tyres' limit.
        RunAnalysis gentle = JudgedRun.Clean(braking: JudgedRun.Stop(0.5 * G, mfdd: 0.5 * G, peak: 0.52 * G));
        Assert.Null(GripLimit.Assess(gentle, namedByUser: false));
        Assert.Null(GripLimit.BestBound([gentle]));
    }

    [Fact]
    public void ARunWithoutAStopHasNoEvidenceEvenWhenNamed()
    {
        Assert.Null(GripLimit.Assess(JudgedRun.Clean(), namedByUser: true));
        Assert.Null(GripLimit.BestBound([], [JudgedRun.Clean()]));
    }

    [Fact]
    public void AStopTheUserNamedBoundsWhateverItLooksLike()
    {
        RunAnalysis gentle = JudgedRun.Clean(braking: JudgedRun.Stop(0.5 * G, mfdd: 0.5 * G, peak: 0.52 * G));
        Assert.Equal(GripLimit.NamedReference, GripLimit.Assess(gentle, namedByUser: true)!.Basis);
        TractionBound bound = GripLimit.BestBound([], [gentle])!;
        Assert.Equal(GripLimit.NamedReference, bound.Basis);
        Assert.Equal(26.8224 / (0.5 * G), bound.Bound0To60S, 9); // t = v / a
        Assert.Equal("judged.log run 1", bound.Source);
    }

    [Fact]
    public void AWheelSlidingDuringTheStopShowsTheLimit()
    {
        // Stop from 20 s; a slide window inside it.
        BrakingResult stop = JudgedRun.Stop(0.6 * G, mfdd: 0.6 * G, peak: 0.9 * G, onsetS: 20);
        RunAnalysis slid = JudgedRun.Clean(braking: stop, reconstruction: r => JudgedRun.Copy(r, slides: [new(20.5, 21.0), new(21.5, 21.75)]));
        GripEvidence evidence = GripLimit.Assess(slid, namedByUser: false)!;
        Assert.Equal(GripLimit.WheelSlide, evidence.Basis);
        Assert.Contains("0.75 s", evidence.Text);

        // Only the part inside the stop counts: a window straddling onset counts from onset.
        RunAnalysis straddling = JudgedRun.Clean(braking: stop, reconstruction: r => JudgedRun.Copy(r, slides: [new(19.0, 20.25)]));
        Assert.Contains("0.25 s", GripLimit.Assess(straddling, false)!.Text);
        RunAnalysis afterStandstill = JudgedRun.Clean(braking: stop, reconstruction: r => JudgedRun.Copy(r, slides: [new(stop.StandstillS - 0.1, stop.StandstillS + 2)]));
        Assert.Contains("0.10 s", GripLimit.Assess(afterStandstill, false)!.Text);

        // A slide wholly before the onset or after standstill is not this stop's.
        RunAnalysis before = JudgedRun.Clean(braking: stop, reconstruction: r => JudgedRun.Copy(r, slides: [new(10.0, 12.0)]));
        Assert.Null(GripLimit.Assess(before, false));
        RunAnalysis after = JudgedRun.Clean(braking: stop, reconstruction: r => JudgedRun.Copy(r, slides: [new(stop.StandstillS + 1, stop.StandstillS + 2)]));
        Assert.Null(GripLimit.Assess(after, false));
    }

    [Fact]
    public void AHighFlatDecelerationIsAPlateauAndASpikeIsNot()
    {
        Assert.Equal(GripLimit.DecelerationPlateau, GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.85 * G, mfdd: 0.9 * G, peak: 0.95 * G)), false)!.Basis);

        // Just under 0.8 g, or a peak more than 1.15 times the MFDD, or no MFDD at all: no plateau.
        Assert.Null(GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.75 * G, mfdd: 0.79 * G, peak: 0.8 * G)), false));
        Assert.Null(GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.85 * G, mfdd: 0.9 * G, peak: 1.1 * G)), false));
        Assert.Null(GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.85 * G, mfdd: null, peak: 0.9 * G)), false));

        // Both thresholds are inclusive.
        var limits = VerdictLimits.Default;
        double mfdd = limits.GripPlateauMps2;
        Assert.NotNull(GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(mfdd, mfdd: mfdd, peak: limits.GripPlateauPeakRatio * mfdd)), false, limits));
    }

    [Fact]
    public void FreshlyMadeLimitsPutThePlateauAtPointEightG()
    {
        // The same stops as above judged with limits made here rather than the shared default:
        // 0.79 g is below the plateau, 0.81 g above it, 0.5 g far below.
        var limits = new VerdictLimits();
        Assert.Null(GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.78 * G, mfdd: 0.79 * G, peak: 0.8 * G)), false, limits));
        Assert.Null(GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.5 * G, mfdd: 0.5 * G, peak: 0.52 * G)), false, limits));
        Assert.Equal(GripLimit.DecelerationPlateau, GripLimit.Assess(JudgedRun.Clean(braking: JudgedRun.Stop(0.8 * G, mfdd: 0.81 * G, peak: 0.82 * G)), false, limits)!.Basis);
    }

    [Fact]
    public void NullCandidatesOrFiguresAreCallerErrors()
    {
        Assert.Throws<ArgumentNullException>(() => GripLimit.Best(null!));
        Assert.Throws<ArgumentNullException>(() => RunJudge.Finish([], null!, null));
    }

    [Fact]
    public void TheBoundComesFromTheQualifyingStopWithTheMostGrip()
    {
        RunAnalysis gentleButHarder = JudgedRun.Clean(braking: JudgedRun.Stop(1.2 * G, mfdd: 0.5 * G, peak: 1.3 * G));
        RunAnalysis plateau = JudgedRun.Clean(braking: JudgedRun.Stop(0.85 * G, mfdd: 0.9 * G, peak: 0.95 * G));
        RunAnalysis slid = JudgedRun.Clean(braking: JudgedRun.Stop(0.95 * G, mfdd: 0.6 * G, peak: 1.0 * G), reconstruction: r => JudgedRun.Copy(r, slides: [new(20.5, 21.0)]));
        TractionBound bound = GripLimit.BestBound([gentleButHarder, plateau, slid])!;
        Assert.Equal(GripLimit.WheelSlide, bound.Basis);
        Assert.Equal(0.95 * G, bound.MeanDecelMps2, 9);

        // A named stop with less grip than a qualifying session stop does not displace it, and a
        // named one with more does.
        RunAnalysis namedWeak = JudgedRun.Clean(braking: JudgedRun.Stop(0.7 * G, mfdd: 0.7 * G, peak: 0.7 * G));
        Assert.Equal(GripLimit.WheelSlide, GripLimit.BestBound([slid], [namedWeak])!.Basis);
        RunAnalysis namedStrong = JudgedRun.Clean(braking: JudgedRun.Stop(1.0 * G, mfdd: 0.7 * G, peak: 1.0 * G));
        Assert.Equal(GripLimit.NamedReference, GripLimit.BestBound([slid], [namedStrong])!.Basis);
    }

    [Fact]
    public void APlateauCountsFromPointEightGAndNotBelow()
    {
        // VerdictLimits: a flat top from 0.8 g (our choice, documented beside the limit).
        RunAnalysis below = JudgedRun.Clean(braking: JudgedRun.Stop(0.78 * G, mfdd: 0.79 * G, peak: 0.8 * G));
        RunAnalysis above = JudgedRun.Clean(braking: JudgedRun.Stop(0.8 * G, mfdd: 0.81 * G, peak: 0.82 * G));
        Assert.Null(GripLimit.Assess(below, namedByUser: false));
        Assert.Equal(GripLimit.DecelerationPlateau, GripLimit.Assess(above, namedByUser: false)!.Basis);
    }

    [Fact]
    public void ANamedStopSaysItWasNamedAndANullRunIsACallerError()
    {
        RunAnalysis gentle = JudgedRun.Clean(braking: JudgedRun.Stop(0.5 * G, mfdd: 0.5 * G, peak: 0.52 * G));
        Assert.Contains("named by the user", GripLimit.Assess(gentle, namedByUser: true)!.Text);
        Assert.Contains("named by the user", GripLimit.BestBound([], [gentle])!.Why);
        Assert.Throws<ArgumentNullException>(() => GripLimit.Assess(null!, namedByUser: false));
    }

    [Fact]
    public void OfTwoStopsWithTheSameGripTheFirstNamedOneServes()
    {
        // Equal mean deceleration: the bound is the same either way, and the report names the
        // stop the user named first rather than changing its mind to a later one.
        RunAnalysis first = JudgedRun.Clean(braking: JudgedRun.Stop(0.9 * G, mfdd: 0.9 * G, peak: 0.95 * G));
        RunAnalysis second = first with { Run = JudgedRun.Copy(first.Run, source: "judged.log run 2") };
        Assert.Equal("judged.log run 1", GripLimit.BestBound([], [first, second])!.Source);
        Assert.Equal("judged.log run 2", GripLimit.BestBound([], [second, first])!.Source);
    }

    [Fact]
    public void LimitsGivenAreTheLimitsUsedAndNullRunsAreCallerErrors()
    {
        // With a plateau threshold of 0.5 g the gentle 0.5 g stop qualifies; by default it does not.
        RunAnalysis gentle = JudgedRun.Clean(braking: JudgedRun.Stop(0.5 * G, mfdd: 0.5 * G, peak: 0.52 * G));
        var lenient = new VerdictLimits { GripPlateauMps2 = 0.5 * G };
        Assert.Equal(GripLimit.DecelerationPlateau, GripLimit.Assess(gentle, namedByUser: false, lenient)!.Basis);
        Assert.Throws<ArgumentNullException>(() => GripLimit.BestBound(null!));
        Assert.Throws<ArgumentNullException>(() => RolloutMarkWindow.For(null!));

        // A wider allowed disagreement widens the rollout window by as much on each side.
        RunAnalysis run = JudgedRun.Clean();
        TimeWindow standard = RolloutMarkWindow.For(run)!.Value;
        TimeWindow wide = RolloutMarkWindow.For(run, new VerdictLimits { RolloutDisagreementS = 0.030 })!.Value;
        Assert.Equal(standard.StartS - 0.020, wide.StartS, 9);
        Assert.Equal(standard.EndS + 0.020, wide.EndS, 9);
    }
}
