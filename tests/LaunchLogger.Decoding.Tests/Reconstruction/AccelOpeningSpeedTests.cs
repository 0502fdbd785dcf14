using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The opening-speed stage on accelerometer-only records from the independent generator:
/// a cruise then a stop, and a standing start; the truth is the generator's speed at the first
/// sample.</summary>
public class AccelOpeningSpeedTests
{
    [Theory]
    [InlineData(41, 15.0, 6.0)]
    [InlineData(42, 24.0, 7.5)]
    [InlineData(43, 9.0, 4.0)]
    public void ARecordThatOpensMovingOpensAtTheSpeedTheStopTakesAway(int seed, double speedMps, double decelMps2)
    {
        // The sensor pitched and biased: both read at the final rest as at the opening, and cancel.
        PrescribedRecord record = Record(seed, PrescribedShapes.CruiseThenStop(speedMps, 0.3, decelMps2));
        PrescribedStages stages = PrescribedStages.Of(record, accelOnly: true);

        Estimate? found = AccelOpeningSpeed.Find(Inputs(stages));

        // The generator's speed at its first sample (sampled at FirstSampleS on the true clock).
        double truth = record.Spec.Shape.Profile.StateAt(record.Spec.Accel!.FirstSampleS).SpeedMps;
        Assert.Equal(speedMps, truth, 9);
        Assert.NotNull(found);
        Assert.InRange(found.Value.Value, truth - (3 * found.Value.Sigma), truth + (3 * found.Value.Sigma));
    }

    [Fact]
    public void ARecordThatOpensAtRestHasNoOpeningSpeed()
    {
        PrescribedRecord record = Record(44, PrescribedShapes.StandingStart(new Random(44)));
        PrescribedStages stages = PrescribedStages.Of(record, accelOnly: true);

        Assert.Equal(0.0, record.Spec.Shape.Profile.StateAt(record.Spec.Accel!.FirstSampleS).SpeedMps);
        Assert.Null(AccelOpeningSpeed.Find(Inputs(stages)));
    }

    [Fact]
    public void ARecordThatDoesNotEndAtRestCannotTellItsOpeningSpeed()
    {
        PrescribedRecord record = Record(45, PrescribedShapes.CruiseThenStop(15, 0.3, 6));
        PrescribedStages stages = PrescribedStages.Of(record, accelOnly: true);

        Assert.Null(AccelOpeningSpeed.Find(Inputs(stages) with { StopS = null }));
    }

    /// <summary>The stage's inputs as the pass makes them: the stop found over the whole record.</summary>
    private static AccelOpeningSpeedInputs Inputs(PrescribedStages stages)
    {
        ForwardAcceleration a = stages.Accel;
        double? stop = RunStop.Find(
            new RunStopInputs
            {
                AccelTimeS = a.TimeS,
                AccelInputMps2 = stages.Prepared.InputMps2,
                AccelNoiseMps2 = stages.Prepared.Rest.NoiseMps2,
                AccelPeriodS = a.PeriodS,
                StopHoldS = stages.Run.Configuration.StopHoldS,
                StillAtEndS = stages.Options.StillAtEndS,
            },
            a.TimeS[0],
            a.TimeS[^1]);
        return new AccelOpeningSpeedInputs
        {
            Accel = a,
            Rest = stages.Prepared.Rest,
            InputMps2 = stages.Prepared.InputMps2,
            StopS = stop,
            Options = stages.Options,
        };
    }

    private static PrescribedRecord Record(int seed, Shape shape) => new PrescribedRecordSpec
    {
        Shape = shape,
        Accel = new AccelSensor { RateHz = 200, NoiseMicroGPerRootHz = 150, BiasXMps2 = -0.04, PitchRad = 0.025 },
        Seed = seed,
    }.Generate();
}
