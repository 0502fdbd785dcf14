using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The rolling-scale stage on prescribed motions written straight into its inputs
/// (<see cref="WindowScene"/>): a tyre that rolls a known fraction further than told, and one that
/// also grows with the square of speed by a known amount, against a calibrated accelerometer.
/// The filter's first pass is stood in for by the prescribed speed.</summary>
public class RollingScaleMeasureTests
{
    private const double MetresPerPulse = 0.05;

    /// <summary>Noise of the accelerometer's input the fit is told, m/s², at 1 kHz.</summary>
    private const double NoiseMps2 = 0.02;

    /// <summary>The stop of <see cref="MovingScene"/>, s.</summary>
    private const double MovingStopS = 11.5 + (32 / 6.0);

    private static readonly ReconstructionOptions Calibrated = new() { AccelScaleCalibration = new Estimate(1, 0.002) };

    /// <summary>3 m/s² from rest for 6 s (18 m/s), then steady to 7 s.</summary>
    private static WindowScene Launch(double scale) => new()
    {
        CarAccelMps2 = t => t < 0 ? 0 : t < 6 ? 3 : 0,
        WheelSpeedMps = (_, v) => v / scale,
        EndS = 7,
        MetresPerPulse = MetresPerPulse,
    };

    [Theory]
    [InlineData(1.012)]
    [InlineData(0.985)]
    public void AStandingLaunchMeasuresHowMuchFurtherTheTyreRollsThanTold(double scale)
    {
        // A tyre rolling `scale` times the circumference told moves the car scale × 0.05 m a
        // pulse; counted at 0.05 m, the road is the count times that (the definition of the
        // rolling circumference; common practice).
        WindowScene scene = Launch(scale);

        RollingScaleMeasurement measured = RollingScaleMeasure.Measure(StandingInputs(scene, Calibrated))!;

        Estimate fit = measured.Fit.Scale;
        Assert.InRange(scale, fit.Value - (3 * fit.Sigma), fit.Value + (3 * fit.Sigma));
        Assert.True(fit.Sigma < Calibrated.CircumferenceSigmaFraction);
        Assert.Equal(MetresPerPulse * fit.Value, measured.MetresPerPulse, 12);
        Assert.Equal(fit.Sigma / fit.Value, measured.CircumferenceSigma, 12);
        Assert.Null(measured.Growth);
        Assert.StartsWith("the pulses' scale was measured over the launch", measured.Note);
    }

    [Fact]
    public void ARecordThatOpensMovingMeasuresTheScaleAndTheGrowth()
    {
        // Opens at 12 m/s; 2 m/s² from 1 s to 11 s (32 m/s); a coast to 11.5 s; 6 m/s² to rest
        // at 11.5 + 32/6 s; at rest to 19 s. The tyre rolls 1 % further than told and grows by
        // G·(v / 30 m/s)² with G = 0.8 %.
        const double Scale = 1.01;
        const double Growth = 0.008;
        WindowScene scene = MovingScene(Scale, Growth, 1);
        PulseChannel pulses = scene.Pulses();
        var options = Calibrated with { TyreGrowthSigmaAt30Mps = 0.01 };
        RollingScaleInputs inputs = MovingInputs(scene, options);

        RollingScaleMeasurement measured = RollingScaleMeasure.Measure(inputs)!;

        Estimate scale = measured.Fit.Scale;
        Estimate growth = measured.Fit.Growth;
        Assert.InRange(Scale, scale.Value - (3 * scale.Sigma), scale.Value + (3 * scale.Sigma));
        Assert.InRange(Growth, growth.Value - (3 * growth.Sigma), growth.Value + (3 * growth.Sigma));
        Assert.True(growth.Sigma < options.TyreGrowthSigmaAt30Mps);
        MeasuredGrowth applied = measured.Growth!;
        Assert.Equal(growth.Sigma, applied.Sigma);
        Assert.Equal(pulses.Length, applied.PulseGrowthM.Length);
        Assert.StartsWith("the pulses' scale was measured over the record's changes of speed and the rest it ends in", measured.Note);

        // The growth adds G·∫(v / 30)²·v dt over the record: at a steady v that is v³·T, and at a
        // constant a from v₀ to v₁ it is (v₁⁴ − v₀⁴) / (4a) (integral of a power; any calculus
        // text), all over 30².
        double integral = (Math.Pow(12, 3) * 1) + ((Math.Pow(32, 4) - Math.Pow(12, 4)) / (4 * 2)) + (Math.Pow(32, 3) * 0.5) + (Math.Pow(32, 4) / (4 * 6));
        double expected = growth.Value * integral / (30 * 30);
        Assert.Equal(expected, applied.PulseGrowthM[^1], expected * 0.02);
    }

    [Theory]
    [InlineData(0.015)]
    [InlineData(-0.012)]
    public void AnUncalibratedAccelerometerMeasuresAMovingRecordsGrowthButNotItsScale(double accelScaleError)
    {
        // The record of the test above, read by an accelerometer whose scale is (1 + s) and not
        // calibrated: it reads the motion of a car (1 + s) times as fast. Written in that car's
        // speeds v' = (1 + s)·v, the pulses count the true distance v'/(1 + s) over the tyre's
        // circumference. The fit's scale then reads (1 + s) times the tyre's (a uniform scale of
        // every distance the accelerometer gives) and is not applied; the growth, a change of
        // the tyre's scale with speed, is the same in either car's terms to within (1 + s)²
        // (G·(v / 30)² = G / (1 + s)²·(v' / 30)²).
        const double Scale = 1.01;
        const double Growth = 0.008;
        double read = 1 + accelScaleError;
        WindowScene scene = MovingScene(Scale, Growth, read);

        // A static circumference told: the typical growth (0.35 % at 30 m/s) comes with it.
        var options = new ReconstructionOptions { TyreGrowthAt30Mps = 0.0035, TyreGrowthSigmaAt30Mps = 0.01 };
        RollingScaleInputs inputs = MovingInputs(scene, options);

        RollingScaleMeasurement measured = RollingScaleMeasure.Measure(inputs)!;

        Estimate scale = measured.Fit.Scale;
        Assert.InRange(Scale * read, scale.Value - (3 * scale.Sigma), scale.Value + (3 * scale.Sigma));
        Assert.False(measured.ScaleMeasured);
        Assert.Equal(MetresPerPulse, measured.MetresPerPulse);
        Assert.Equal(options.CircumferenceSigmaFraction, measured.CircumferenceSigma);

        Estimate growth = measured.Fit.Growth;
        Assert.InRange(Growth, growth.Value - (3 * growth.Sigma), growth.Value + (3 * growth.Sigma));
        Assert.True(growth.Sigma < options.TyreGrowthSigmaAt30Mps);
        MeasuredGrowth applied = measured.Growth!;
        Assert.Equal(growth.Sigma, applied.Sigma);
        Assert.Equal(0, applied.ScaleCorrelation);
        Assert.StartsWith("the tyre's growth with speed was measured", measured.Note);

        // A circumference measured by rolling (no typical growth told) is left as told.
        Assert.Null(RollingScaleMeasure.Measure(inputs with { Options = options with { TyreGrowthAt30Mps = 0 } }));
    }

    [Theory]
    [InlineData("no calibration")]
    [InlineData("no accelerometer")]
    [InlineData("slip kept")]
    [InlineData("slip told apart")]
    public void NothingIsMeasuredWhereTheWheelCannotBeTakenToRollFreelyOrALaunchIsReadByAnUncalibratedAccelerometer(string why)
    {
        RollingScaleInputs inputs = StandingInputs(Launch(1.012), Calibrated);
        inputs = why switch
        {
            "no calibration" => inputs with { Options = new ReconstructionOptions { TyreGrowthAt30Mps = 0.0035 } },
            "no accelerometer" => inputs with { AccelEndS = null },
            "slip kept" => inputs with { SlipKept = true },
            _ => inputs with { SlipToldApart = true },
        };

        Assert.Null(RollingScaleMeasure.Measure(inputs));
    }

    /// <summary>Opens at 12 m/s; 2 m/s² from 1 s to 11 s (32 m/s); a coast to 11.5 s; 6 m/s²
    /// to rest at 11.5 + 32/6 s; at rest to 19 s. The tyre rolls <paramref name="scale"/> times
    /// the circumference told and grows by G·(v / 30 m/s)², G = <paramref name="growth"/>; the
    /// accelerometer reads <paramref name="read"/> times the true force, so the scene is written
    /// in the speeds it reads, v' = read·v, and the wheel turns at the true v = v' / read.</summary>
    private static WindowScene MovingScene(double scale, double growth, double read) => new()
    {
        CarAccelMps2 = t => read * (t < 1 ? 0 : t < 11 ? 2 : t < 11.5 ? 0 : t < MovingStopS ? -6 : 0),
        WheelSpeedMps = (_, v) => v / read / (scale * (1 + (growth * (v / read / 30) * (v / read / 30)))),
        InitialSpeedMps = 12 * read,
        PreRollS = 0,
        EndS = 19,
        MetresPerPulse = MetresPerPulse,
    };

    /// <summary>The inputs of a <see cref="MovingScene"/>: it opens moving at its first pulse and stops.</summary>
    private static RollingScaleInputs MovingInputs(WindowScene scene, ReconstructionOptions options)
    {
        PulseChannel pulses = scene.Pulses();
        return StandingInputs(scene, options) with
        {
            StartS = pulses.MidS(0),
            StopS = MovingStopS,
            Pulses = pulses,
            Staged = false,
            Opening = StartMotion.Estimate(pulses, MetresPerPulse, 1e-4),
            FirstPassSpeedMps = SpeedOnGrid(scene),
        };
    }

    private static RollingScaleInputs StandingInputs(WindowScene scene, ReconstructionOptions options) => new()
    {
        Steps = scene.Grid(),
        StartS = scene.StartS,
        Spin = [],
        Slides = [],
        Pulses = scene.Pulses(),
        MetresPerPulse = MetresPerPulse,
        Staged = true,
        AccelEndS = scene.EndS,
        AccelRestLevelSigmaMps2 = 0.001,
        InputDensity = NoiseMps2 * NoiseMps2 * 0.001,
        FirstPassSpeedMps = SpeedOnGrid(scene),
        Options = options,
    };

    /// <summary>The car's speed at each grid point, integrated from the scene's acceleration.</summary>
    private static double[] SpeedOnGrid(WindowScene scene)
    {
        StepGrid grid = scene.Grid();
        var speed = new double[grid.TimeS.Length];
        speed[0] = grid.TimeS[0] < scene.StartS ? 0 : scene.InitialSpeedMps;
        for (int k = 1; k < speed.Length; k++)
        {
            speed[k] = speed[k - 1] + grid.StepSpeedMps[k - 1];
        }

        return speed;
    }
}
