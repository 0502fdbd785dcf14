using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>Slides under braking on a coarse ring read by a slow polling loop: 12 teeth on a
/// 2.0 m tyre (0.167 m a pulse) polled every 5 ms, so at 40 m/s a poll sees about one pulse and a
/// 40 ms span of pulses is uncertain by a tenth from its brackets alone. The runs are built from
/// closed-form motions (kinematics, any textbook; <see cref="Motion"/>) whose wheel rolls with the
/// car unless a slide is put in, so the truth of "slid or not" is the generator's, not the
/// decoder's.</summary>
public class CoarseRingSlideTests
{
    private const double G0 = 9.80665; // standard gravity, ISO 80000-3
    private const double StartS = 5.0;

    /// <summary>0.5 g for 8 s (39.2 m/s), then a 0.5 g stop of 8 s: an ordinary stop, well short
    /// of a tyre's grip (about 1 g on a dry road; common practice).</summary>
    private static Motion LongHalfGStop() => Motion.FromRestAt(StartS).Accelerate(0.5 * G0, 8).BrakeToStop(0.5 * G0);

    private static SyntheticRun CoarsePolled(Motion motion, int seed, double slidePeakMps = 0, double slideStartS = 0, double slideLengthS = 0) => new()
    {
        Motion = motion,
        Seed = seed,
        Teeth = 12,
        CircumferenceM = 2.0,
        PollPeriodS = 0.005,
        PollJitterS = 0.0002,
        SpinPeakMps = slidePeakMps,
        SpinStartS = slideStartS,
        SpinLengthS = slideLengthS,
    };

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    [InlineData(6)]
    public void AWheelRollingThroughAnOrdinaryStopIsNotASlide(int seed)
    {
        DecodedRun input = CoarsePolled(LongHalfGStop(), seed).Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input);

        Assert.Empty(run.BrakingSlideWindows);
        RunAnalysis analysis = RunAnalyzer.Analyze(input);
        Assert.NotNull(analysis.Braking);
        Assert.Null(GripLimit.Assess(analysis, namedByUser: false));
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void AWheelSlidingOnTheSameRingIsStillFound(int seed)
    {
        // From 2 s into the stop (29.4 m/s) the wheel falls up to 8 m/s behind the car (27 %, a
        // locking wheel) and back over 1.5 s.
        Motion motion = LongHalfGStop();
        double slideS = StartS + 8 + 2;
        DecodedRun input = CoarsePolled(motion, seed, -8, slideS, 1.5).Build();
        ReconstructedRun run = SyntheticRun.Reconstruct(input);

        Assert.Contains(run.BrakingSlideWindows, w => w.StartS < slideS + 1.5 && w.EndS > slideS);
        Assert.Equal(GripLimit.WheelSlide, GripLimit.Assess(RunAnalyzer.Analyze(input), namedByUser: false)?.Basis);
    }
}
