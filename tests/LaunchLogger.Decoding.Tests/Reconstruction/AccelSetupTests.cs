using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The accelerometer stage on samples written straight into it: a box at rest with a
/// known tilt, then a prescribed launch (<see cref="WindowScene"/>); a record that opens moving at
/// a known acceleration; a forward axis with a known scale error.</summary>
public class AccelSetupTests
{
    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901).</summary>
    private const double G0 = 9.80665;

    /// <summary>At rest until 2 s, then 4 m/s² to 6 s and a steady speed to 7 s.</summary>
    private static readonly WindowScene Launch = new()
    {
        CarAccelMps2 = t => t < 2 ? 0 : t < 6 ? 4 : 0,
        StartS = 2,
        PreRollS = 2,
        EndS = 7,
    };

    [Theory]
    [InlineData(2.0, 1.5, 1.0)]
    [InlineData(-3.0, 0.0, 1.004)]
    [InlineData(0.5, -4.0, 0.996)]
    public void TheRestingPitchIsTheForwardComponentsAngleToTheOthers(double pitchDeg, double rollDeg, double sensorScale)
    {
        // The box pitched θ nose up and rolled φ reads gravity's reaction on its axes as
        // (g·sin θ, −g·cos θ·sin φ, g·cos θ·cos φ), all times its scale (rotation of a vector;
        // from memory). Its pitch is atan2(gx, √(gy² + gz²)), whatever the roll and the scale
        // (tilt sensing from a three-axis accelerometer, NXP application note AN3461; from memory).
        double theta = pitchDeg * Math.PI / 180;
        double phi = rollDeg * Math.PI / 180;
        double gx = sensorScale * G0 * Math.Sin(theta);
        double gy = -sensorScale * G0 * Math.Cos(theta) * Math.Sin(phi);
        double gz = sensorScale * G0 * Math.Cos(theta) * Math.Cos(phi);
        ForwardAcceleration accel = Samples(Launch, t => gx + (sensorScale * Launch.CarAccelMps2(t)), noiseMps2: 0.02, seed: 1);

        PreparedAccel prepared = AccelSetup.Prepare(Inputs(Launch, accel) with { RestGravityMilliG = (gx / G0 * 1000, gy / G0 * 1000, gz / G0 * 1000) });

        double expected = Math.Atan2(gx, Math.Sqrt((gy * gy) + (gz * gz)));
        Assert.InRange(prepared.PitchRad, expected - (3 * prepared.PitchSigmaRad), expected + (3 * prepared.PitchSigmaRad));

        // σ: the level's own σ through the arcsine's slope, d(asin x)/dx = 1/√(1 − x²) (any
        // calculus text), checked by a central difference.
        double magnitude = sensorScale * G0;
        double level = prepared.Rest.LevelMps2;
        double h = prepared.Rest.LevelSigmaMps2;
        double slope = (Math.Asin((level + h) / magnitude) - Math.Asin((level - h) / magnitude)) / 2;
        Assert.True(h > 0);
        Assert.Equal(slope, prepared.PitchSigmaRad, 9);
    }

    [Fact]
    public void TheRestingLevelIsTheMeanReadingBeforeMotion()
    {
        // A level ground and a 0.15 m/s² offset: the resting level is the offset, to within the
        // mean's σ (the noise over √n; any statistics text).
        const double Offset = 0.15;
        ForwardAcceleration accel = Samples(Launch, t => Offset + Launch.CarAccelMps2(t), noiseMps2: 0.02, seed: 2);

        PreparedAccel prepared = AccelSetup.Prepare(Inputs(Launch, accel));

        Assert.InRange(prepared.Rest.LevelMps2, Offset - (3 * prepared.Rest.LevelSigmaMps2), Offset + (3 * prepared.Rest.LevelSigmaMps2));
        Assert.InRange(prepared.Rest.LevelSigmaMps2, 0.7 * 0.02 / Math.Sqrt(2000), 1.5 * 0.02 / Math.Sqrt(200));
        Assert.Empty(prepared.Warnings);
        Assert.Equal(double.PositiveInfinity, prepared.FinalRestFromS);
    }

    [Theory]
    [InlineData(51, 0.03, 0.0, 0.05, 0.0)]
    [InlineData(52, -0.02, 0.04, -0.03, 0.004)]
    [InlineData(53, 0.0, -0.035, 0.0, -0.003)]
    public void TheRestingLevelIsGravitysProjectionThroughTheMountingAndTheGrade(int seed, double pitchRad, double gradeRad, double biasMps2, double scaleError)
    {
        // A record from the independent generator, its files imported: a box pitched θ on a grade γ.
        var spec = new PrescribedRecordSpec
        {
            Shape = PrescribedShapes.StandingStart(new Random(seed)),
            Accel = new AccelSensor { RateHz = 400, NoiseMicroGPerRootHz = 150, PitchRad = pitchRad, GradeRad = gradeRad, BiasXMps2 = biasMps2, ScaleError = scaleError },
            Seed = seed,
        };
        PrescribedStages stages = PrescribedStages.Of(spec.Generate());
        AccelRest rest = stages.Prepared.Rest;

        // Standing on the grade the sensor feels gravity's reaction g·sin γ along the road and
        // g·cos γ across it; turned by θ about the lateral axis, its forward axis reads
        // g·sin γ·cos θ + g·cos γ·sin θ = g·sin(θ + γ) (rotation of a vector, and the angle-sum
        // identity, Abramowitz & Stegun 4.3.16), times its scale plus its bias.
        double expected = ((1 + scaleError) * G0 * Math.Sin(pitchRad + gradeRad)) + biasMps2;
        Assert.InRange(rest.LevelMps2, expected - (3 * rest.LevelSigmaMps2), expected + (3 * rest.LevelSigmaMps2));

        // The noise read with it is the sensor's per-sample noise: a standard deviation from a few
        // hundred samples lies within 15 % (its σ is σ/√(2(n − 1)), any statistics text; 4σ at n = 400).
        double noise = spec.Accel.NoisePerSampleMps2;
        Assert.InRange(rest.NoiseMps2, 0.85 * noise, 1.15 * noise);

        // The samples the stage read from are left as read.
        Assert.Same(stages.Run.Accel!.ForwardMps2, stages.Accel.ForwardMps2);
        Assert.Same(stages.Run.Accel.TimeS, stages.Accel.TimeS);
    }

    [Fact]
    public void TheOnsetOfAStepLaunchIsAtTheStep()
    {
        ForwardAcceleration accel = Samples(Launch, Launch.CarAccelMps2, noiseMps2: 0.02, seed: 3);

        PreparedAccel prepared = AccelSetup.Prepare(Inputs(Launch, accel));

        // Prescribed: the acceleration steps from 0 to 4 m/s² at 2.000 s; a step is found within
        // a sample period (1 ms) and its σ.
        AccelOnset onset = prepared.Onset!.Value;
        Assert.InRange(onset.TimeS, 2.0 - 0.001 - (3 * onset.SigmaS), 2.0 + 0.001 + (3 * onset.SigmaS));
    }

    [Theory]
    [InlineData(1.02)]
    [InlineData(0.97)]
    public void TheCalibratedScaleIsDividedOut(double scale)
    {
        // A level box whose axis has scale factor k reads k times the specific force (IEEE Std
        // 1293, linear accelerometers' scale factor; from memory): divided by the k told, the
        // input during the launch is the prescribed 4 m/s².
        ForwardAcceleration accel = Samples(Launch, t => scale * Launch.CarAccelMps2(t), noiseMps2: 0, seed: 0);
        var options = new ReconstructionOptions { AccelScaleCalibration = new Estimate(scale, 0.002) };

        PreparedAccel prepared = AccelSetup.Prepare(Inputs(Launch, accel) with { Options = options });

        int i = accel.IndexAtOrAfter(4.0);
        Assert.Equal(4.0, prepared.InputMps2[i], 6);
        Assert.Equal(0.0, prepared.InputMps2[accel.IndexAtOrAfter(1.0)], 6);
    }

    [Fact]
    public void ARecordThatOpensMovingTakesTheLevelAgainstTheFirstPulsesAcceleration()
    {
        // Opens at 20 m/s, accelerating at 1.5 m/s² throughout: over the first 0.3 s the axis
        // reads the level plus 1.5 m/s² (a specific-force sensor along the motion; common
        // practice), so the level is the reading less what the first pulses say.
        const double Offset = -0.08;
        var moving = new WindowScene { CarAccelMps2 = _ => 1.5, InitialSpeedMps = 20, PreRollS = 0, EndS = 3 };
        PulseChannel pulses = moving.Pulses();
        ForwardAcceleration accel = Samples(moving, t => Offset + 1.5, noiseMps2: 0, seed: 0);
        var opening = new StartMotion(true, new Estimate(20, 0.05), new Estimate(1.5, 0.04), 0.2);

        PreparedAccel prepared = AccelSetup.Prepare(Inputs(moving, accel) with { Pulses = pulses, Staged = false, Opening = opening });

        Assert.Equal(Offset, prepared.Rest.LevelMps2, 9);

        // Its σ holds the first pulses' acceleration σ (independent of the reading's: in quadrature).
        Assert.True(prepared.Rest.LevelSigmaMps2 >= 0.04);
        Assert.Null(prepared.Onset);
        Assert.Equal(double.PositiveInfinity, prepared.FinalRestFromS);
    }

    [Fact]
    public void ARecordThatOpensMovingAndEndsAtRestAlsoReadsTheLevelThere()
    {
        // Opens at 15 m/s, brakes at 5 m/s² from 1 s to rest at 4 s, stands to 8 s.
        const double Offset = 0.12;
        var stop = new WindowScene { CarAccelMps2 = t => t < 1 ? 0 : t < 4 ? -5 : 0, InitialSpeedMps = 15, PreRollS = 0, EndS = 8 };
        PulseChannel pulses = stop.Pulses();
        ForwardAcceleration accel = Samples(stop, t => Offset + stop.CarAccelMps2(t), noiseMps2: 0.02, seed: 4);
        var opening = new StartMotion(true, new Estimate(15, 0.05), new Estimate(0, 0.5), 0.2);

        PreparedAccel prepared = AccelSetup.Prepare(Inputs(stop, accel) with { Pulses = pulses, Staged = false, Opening = opening, StoppedEvent = true });

        // The rest is read from a second after the last pulse; there the level is known to the
        // mean's σ and the 0.05 m/s² it may have changed, far better than the opening's 0.5 m/s²:
        // the inverse-variance mean (any statistics text) lies near the final rest's level.
        Assert.Equal(pulses.HiS[^1] + 1.0, prepared.FinalRestFromS, 9);
        Assert.InRange(prepared.Rest.LevelMps2, Offset - (3 * prepared.Rest.LevelSigmaMps2), Offset + (3 * prepared.Rest.LevelSigmaMps2));
        Assert.InRange(prepared.Rest.LevelSigmaMps2, 0.04, 0.06);
    }

    private static AccelSetupInputs Inputs(WindowScene scene, ForwardAcceleration accel) => new()
    {
        Accel = accel,
        Pulses = scene.Pulses(),
        MetresPerPulse = scene.MetresPerPulse,
        Staged = true,
        Options = new ReconstructionOptions(),
    };

    /// <summary>The forward axis at 1 kHz over the scene's span, reading
    /// <paramref name="reading"/> plus white noise of <paramref name="noiseMps2"/>.</summary>
    private static ForwardAcceleration Samples(WindowScene scene, Func<double, double> reading, double noiseMps2, int seed)
    {
        (double[] times, _) = scene.Accelerometer();
        var random = new Random(seed);
        var forward = new double[times.Length];
        for (int i = 0; i < times.Length; i++)
        {
            double gauss = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
            forward[i] = reading(times[i]) + (noiseMps2 * gauss);
        }

        return ForwardAcceleration.From(new AccelSeries { TimeS = times, ForwardMps2 = forward, SamplePeriodS = 0.001 })!;
    }
}
