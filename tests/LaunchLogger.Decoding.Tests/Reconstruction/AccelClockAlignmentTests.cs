using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The clock stage on records from the independent generator: 40 s at rest, then a
/// standing start, the accelerometer's file timed by a clock that runs fast or slow against the
/// pulses'. The truth of the offset is the generator's: sample i is taken at t₀ + i·(1 − d)/rate
/// and stamped t₀ + i/rate (<see cref="AccelSensor"/>), so the sample taken at true time t is
/// stamped t₀ + (t − t₀)/(1 − d), which stands δ = (t − t₀)·d/(1 − d) after t.</summary>
public class AccelClockAlignmentTests
{
    [Theory]
    [InlineData(31, 80.0)]
    [InlineData(32, -70.0)]
    [InlineData(33, 95.0)]
    [InlineData(34, -60.0)]
    public void TheOffsetMatchedIsTheOneTheClocksDriftMadeByFirstMotion(int seed, double driftPpm)
    {
        (PrescribedRecord record, PrescribedStages stages) = Record(seed, driftPpm);
        TruthRun truth = Assert.Single(record.Truth);
        AccelOnset onset = stages.Prepared.Onset!.Value;

        AccelClockMatch match = AccelClockAlignment.Align(Inputs(stages, onset))!;

        // δ at true first motion (closed form above): 40 s × 60–95 ppm, 2.4–3.8 ms.
        double d = driftPpm * 1e-6;
        double delta = (truth.FirstMotionS!.Value - record.Spec.Accel!.FirstSampleS) * d / (1 - d);
        Assert.InRange(-match.ShiftS, delta - (3 * match.OffsetSigmaS), delta + (3 * match.OffsetSigmaS));

        // The match is worth making: σ well inside the offset it finds.
        Assert.True(match.OffsetSigmaS < Math.Abs(delta) / 3, FormattableString.Invariant($"σ {match.OffsetSigmaS * 1e3:F2} ms for δ {delta * 1e3:F2} ms"));

        // Moved onto the pulses' clock, the onset is first motion to within its σ, the offset's σ
        // and a sample's placement (uniform over a period: σ = T/√12, any statistics text).
        double placement = stages.Accel.PeriodS / Math.Sqrt(12);
        double sigma = Math.Sqrt((onset.SigmaS * onset.SigmaS) + (match.OffsetSigmaS * match.OffsetSigmaS) + (placement * placement));
        Assert.InRange(match.Onset.TimeS, truth.FirstMotionS.Value - (3 * sigma), truth.FirstMotionS.Value + (3 * sigma));
    }

    [Fact]
    public void TheSamplesAreMovedOnANewAxisAndTheOnesReadStayAsTheyWere()
    {
        (_, PrescribedStages stages) = Record(35, 90);
        double[] before = [.. stages.Accel.TimeS];

        AccelClockMatch match = AccelClockAlignment.Align(Inputs(stages, stages.Prepared.Onset!.Value))!;

        Assert.NotSame(stages.Accel, match.Accel);
        Assert.Equal(before, stages.Accel.TimeS);
        Assert.Equal(stages.Run.Accel!.TimeS, stages.Accel.TimeS);
        Assert.All(Enumerable.Range(0, before.Length), i => Assert.Equal(before[i] + match.ShiftS, match.Accel.TimeS[i], 9));
        Assert.Equal(stages.Prepared.Onset!.Value.TimeS + match.ShiftS, match.Onset.TimeS, 9);
    }

    [Fact]
    public void AClockThatCannotHaveSlidPastASamplesPlacementIsLeftAlone()
    {
        // A log's samples are timed from the box's own reads (the prior is 0), and a file's clock
        // a moment after its first sample cannot have slid by more than T/√12: nothing to match.
        (_, PrescribedStages stages) = Record(36, 90);
        AccelClockInputs inputs = Inputs(stages, stages.Prepared.Onset!.Value);

        Assert.Null(AccelClockAlignment.Align(inputs with { PriorOffsetSigmaS = 0 }));
        Assert.Null(AccelClockAlignment.Align(inputs with { PriorOffsetSigmaS = 0.99 * stages.Accel.PeriodS / Math.Sqrt(12) }));
    }

    /// <summary>The clock stage's inputs as the pass makes them for a plain-text file.</summary>
    private static AccelClockInputs Inputs(PrescribedStages stages, AccelOnset onset)
    {
        ForwardAcceleration a = stages.Accel;
        return new AccelClockInputs
        {
            Accel = a,
            Rest = stages.Prepared.Rest,
            InputMps2 = stages.Prepared.InputMps2,
            PitchRad = stages.Prepared.PitchRad,
            Onset = onset,
            Pulses = stages.Channel.Pulses!,
            MetresPerPulse = stages.Channel.MetresPerPulse,
            PriorOffsetSigmaS = stages.Options.TextAccelClockRateSigma * (onset.TimeS - a.TimeS[0]),
            Options = stages.Options,
        };
    }

    private static (PrescribedRecord Record, PrescribedStages Stages) Record(int seed, double driftPpm)
    {
        var spec = new PrescribedRecordSpec
        {
            Shape = PrescribedShapes.LongIdle(new Random(seed), idleS: 40),
            Pickup = new WheelPickup(48, TyreModel.Calibrated(1.96)),
            Accel = new AccelSensor { RateHz = 400, NoiseMicroGPerRootHz = 150, BiasXMps2 = 0.03, PitchRad = 0.02, ClockDriftPpm = driftPpm },
            Seed = seed,
        };
        PrescribedRecord record = spec.Generate();
        return (record, PrescribedStages.Of(record));
    }
}
