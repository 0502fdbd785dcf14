using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The stop search on prescribed motions written straight into its inputs
/// (<see cref="WindowScene"/>): a launch to 10 m/s from a standing start, then a stop at a
/// constant 6 m/s² to rest at a known time, the record running on after it or cut short.</summary>
public class RunStopTests
{
    private const double BrakeS = 4.0;
    private const double DecelMps2 = 6.0;

    // 10 m/s ÷ 6 m/s² after the brakes come on (constant-acceleration kinematics).
    private const double TruthStopS = BrakeS + (10.0 / DecelMps2);

    [Fact]
    public void PulsesAloneStopWithinTheLastPitchOfTheTruth()
    {
        WindowScene scene = Stop(endS: TruthStopS + 2);
        PulseChannel pulses = scene.Pulses();

        double? stop = RunStop.Find(new RunStopInputs { Pulses = pulses, MetresPerPulse = scene.MetresPerPulse, StopHoldS = 1.5 }, 0, scene.EndS);

        // The next edge never came, so the car covered under one pitch p after the last one; at
        // a constant deceleration a that takes at most √(2p/a) (kinematics, closed form).
        Assert.NotNull(stop);
        Assert.InRange(stop.Value, pulses.MidS(pulses.Length - 1), scene.EndS);
        Assert.Equal(TruthStopS, stop.Value, Math.Sqrt(2 * scene.MetresPerPulse / DecelMps2));
    }

    [Fact]
    public void TheAccelerometerMarksTheStopWithinTwoSamples()
    {
        WindowScene scene = Stop(endS: TruthStopS + 2);
        (double[] time, double[] input) = scene.Accelerometer();

        double? stop = RunStop.Find(
            new RunStopInputs { Pulses = scene.Pulses(), MetresPerPulse = scene.MetresPerPulse, AccelTimeS = time, AccelInputMps2 = input, AccelNoiseMps2 = 0.02, AccelPeriodS = 0.001, StopHoldS = 1.5 },
            0,
            scene.EndS);

        // The deceleration falls to nothing as the car comes to rest (common practice): the
        // 1-kHz samples place that step to a sample or two.
        Assert.NotNull(stop);
        Assert.Equal(TruthStopS, stop.Value, 0.002);
    }

    [Theory]
    [InlineData(100)]
    [InlineData(125)]
    [InlineData(200)]
    public void ASlowAccelerometerStillMarksTheStepInsideItsSampleGap(int rateHz)
    {
        // 100 Hz gives two samples in 20 ms, where the step search wanted three either side:
        // it found no step, and the stop came from the last pulses' speed integrated on (bench
        // stops at 100 Hz 13–17 ms early or 70–820 ms late).
        double period = 1.0 / rateHz;
        WindowScene scene = Stop(endS: TruthStopS + 2);
        (double[] time, double[] input) = scene.Accelerometer(period);
        PulseChannel pulses = scene.Pulses();

        double? step = StopFinder.DecelerationStep(time, input, pulses.MidS(pulses.Length - 1), scene.EndS);

        // −6 m/s² at every sample before the truth, nothing from it on: the last sample braking
        // and the first at rest bracket the truth, and the step is placed mid-way between them.
        Assert.NotNull(step);
        Assert.Equal(TruthStopS, step.Value, (0.5 * period) + 1e-9);
    }

    [Fact]
    public void TheSpeedLostInTheLastSampleGapIsUniformOverTheGap()
    {
        // The same stop at 100 Hz with the truth moved through the gap: the car loses D·τ there,
        // τ the time it still braked, while the input taken as linear between the samples takes
        // off D·T/2. Over evenly spread places the difference is uniform on ±D·T/2, so its rms is
        // D·T/√12 (the uniform distribution's σ, any probability text) and it never passes √3 σ.
        const double period = 0.01;
        double sumSquares = 0;
        int count = 0;
        for (double tau = 0.0005; tau < period; tau += 0.001)
        {
            double stop = 5 + tau;
            double[] time = [.. Enumerable.Range(0, 1000).Select(i => i * period)];
            double[] input = [.. time.Select(t => t < stop ? -DecelMps2 : 0)];
            double sigma = Math.Sqrt(StopFinder.StopGapSpeedVariance(time, input, 5 + (0.5 * period)));
            double lost = DecelMps2 * tau;
            double linear = 0.5 * DecelMps2 * period;
            Assert.InRange(Math.Abs(lost - linear), 0, (Math.Sqrt(3) * sigma) + 1e-12);
            sumSquares += (lost - linear) * (lost - linear);
            count++;
        }

        Assert.Equal(DecelMps2 * period / Math.Sqrt(12), Math.Sqrt(sumSquares / count), 0.01 * DecelMps2 * period / Math.Sqrt(12));
    }

    [Fact]
    public void ARecordCutWhileStillDrivingHasNoStopUnlessTheBoxLoggedOne()
    {
        // The record ends at 3.5 s, at 8.75 m/s and still accelerating, 0.5 s before the brakes.
        WindowScene scene = Stop(endS: 3.5);
        PulseChannel pulses = scene.Pulses();
        var cut = new RunStopInputs { Pulses = pulses, MetresPerPulse = scene.MetresPerPulse, StopHoldS = 1.5 };

        Assert.Null(RunStop.Find(cut, 0, scene.EndS));
        Assert.NotNull(RunStop.Find(new RunStopInputs { Pulses = pulses, MetresPerPulse = scene.MetresPerPulse, StopHoldS = 1.5, StoppedEvent = true }, 0, scene.EndS));
    }

    [Theory]
    [InlineData(100, 0.0)]
    [InlineData(200, 0.0)]
    [InlineData(400, 0.0)]
    [InlineData(800, 0.0)]
    [InlineData(1600, 0.0)]
    [InlineData(100, 0.05)]
    [InlineData(200, 0.05)]
    [InlineData(400, 0.05)]
    [InlineData(800, 0.05)]
    [InlineData(1600, 0.05)]
    public void AnAccelerometerOnlyStopFallsBetweenTheLastStoppingSampleAndTheFirstAtRest(int rateHz, double noiseMps2)
    {
        // The resting level removed, a record running 2 s past the stop; white noise of σ
        // noiseMps2 a sample (seeded, invented) when told.
        double period = 1.0 / rateHz;
        WindowScene scene = Stop(endS: TruthStopS + 2);
        (double[] time, double[] input) = scene.Accelerometer(period);
        var random = new Random(rateHz);
        for (int i = 0; i < input.Length && noiseMps2 > 0; i++)
        {
            input[i] += noiseMps2 * SyntheticRun.Gaussian(random);
        }

        double? stop = RunStop.Find(new RunStopInputs { AccelTimeS = time, AccelInputMps2 = input, AccelNoiseMps2 = Math.Max(noiseMps2, 0.02), AccelPeriodS = period }, 0, scene.EndS);

        // Prescribed: −6 m/s² at every sample before the truth, nothing from it on, so the truth
        // lies after the last sample still stopping and no later than the first at rest; the
        // search places it mid-way, within half a period of the truth when clean. With noise
        // the speed the last window still takes off, over the deceleration before it, is off
        // by σ·√(2h+1)·T/a at 1σ (h the half-window's samples, T the period; the sum of independent
        // errors, GUM): at 3σ 0.08 of a period at 100 Hz, 0.32 at 1600 Hz, so within 0.9 of one.
        Assert.NotNull(stop);
        Assert.Equal(TruthStopS, stop.Value, (noiseMps2 > 0 ? 0.9 : 0.5 + 1e-9) * period);
    }

    [Fact]
    public void AnAccelerometerOnlyRecordStillMovingAtItsEndHasNoStop()
    {
        // The record ends 0.5 s into the stop, the input still −6 m/s².
        WindowScene scene = Stop(endS: BrakeS + 0.5);
        (double[] time, double[] input) = scene.Accelerometer(0.01);

        Assert.Null(RunStop.Find(new RunStopInputs { AccelTimeS = time, AccelInputMps2 = input, AccelNoiseMps2 = 0.02, AccelPeriodS = 0.01 }, 0, scene.EndS));
    }

    /// <summary>2.5 m/s² for 4 s (to 10 m/s), then 6 m/s² of braking to rest.</summary>
    private static WindowScene Stop(double endS) => new()
    {
        CarAccelMps2 = t => t < 0 ? 0 : t < BrakeS ? 2.5 : t < TruthStopS ? -DecelMps2 : 0,
        EndS = endS,
        StopS = endS > TruthStopS ? TruthStopS : null,
    };
}
