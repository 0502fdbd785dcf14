using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Simulation.Tests.Sensors;

public sealed class AccelerometerModelTests
{
    private static readonly AccelerometerSpec Quiet = new()
    {
        OutputDataRateHz = 800, ClockDriftPpm = 0, NoiseDensityMicroGPerRootHz = 0, VibrationMilliGRms = 0,
        BiasMilliG = AxisTriple.Zero, ScaleError = AxisTriple.Zero, MountPitchDeg = 0, MountRollDeg = 0, MountYawDeg = 0, FullScaleG = 8,
    };

    [Theory]
    [InlineData(800, 0)]
    [InlineData(800, 5000)]
    [InlineData(400, -3000)]
    [InlineData(1600, 1500)]
    public void Sample_count_follows_the_rate_and_its_clock_drift(double odr, double driftPpm)
    {
        var model = new AccelerometerModel(Quiet with { OutputDataRateHz = odr, ClockDriftPpm = driftPpm }, 0, new Random(1));
        Run(model, seconds: 10, accel: 0);

        // Definition of a clock offset in ppm: the sensor delivers ODR·(1 + drift·10⁻⁶) samples per
        // second of the box's clock.
        double expected = 10 * odr * (1 + (driftPpm * 1e-6));
        Assert.InRange(model.SampleTimesS.Count, expected - 1, expected + 1);
    }

    [Theory]
    [InlineData(150, 0, 800)]
    [InlineData(400, 0, 800)]
    [InlineData(100, 5, 1600)]
    public void Noise_has_the_configured_standard_deviation(double densityMicroG, double vibrationMilliG, double odr)
    {
        var spec = Quiet with { NoiseDensityMicroGPerRootHz = densityMicroG, VibrationMilliGRms = vibrationMilliG, OutputDataRateHz = odr };
        var model = new AccelerometerModel(spec, 0, new Random(7));
        Run(model, seconds: 30, accel: 0);
        double[] x = Axis(model, 0);
        double[] z = Axis(model, 2);

        // White noise over the Nyquist band: σ = density·√(ODR/2), added in quadrature to the
        // vibration; rounding to whole milli-g adds a uniform error of variance 1/12 (Widrow &
        // Kollár, Quantization Noise, ch. 4). The sample σ of n draws has a relative spread of
        // about 1/√(2n), under 0.3 % here: 3 % is far outside chance.
        double sensor = densityMicroG * 1e-3 * Math.Sqrt(odr / 2);
        double sigma = Math.Sqrt((sensor * sensor) + (vibrationMilliG * vibrationMilliG) + (1.0 / 12));
        Assert.InRange(MathNet.Numerics.Statistics.Statistics.StandardDeviation(x), 0.97 * sigma, 1.03 * sigma);
        Assert.InRange(MathNet.Numerics.Statistics.Statistics.StandardDeviation(z), 0.97 * sigma, 1.03 * sigma);
        Assert.InRange(MathNet.Numerics.Statistics.Statistics.Mean(z), 1000 - (5 * sigma / Math.Sqrt(z.Length)) - 0.5, 1000 + (5 * sigma / Math.Sqrt(z.Length)) + 0.5);
    }

    [Fact]
    public void A_still_sensor_reads_gravity_through_its_mounting_bias_and_scale()
    {
        var spec = Quiet with { MountPitchDeg = 3, MountRollDeg = -2, BiasMilliG = new(10, -20, 30), ScaleError = new(0.01, 0, -0.02) };
        var model = new AccelerometerModel(spec, 0, new Random(1));
        Run(model, seconds: 0.1, accel: 0);

        // Rotation geometry: gravity's reaction (1000 mg up) seen by axes tilted by pitch β and
        // roll ρ reads x = 1000·sin β, y = 1000·cos β·sin ρ, z = 1000·cos β·cos ρ, then scale and bias.
        double beta = 3 * Math.PI / 180;
        double rho = -2 * Math.PI / 180;
        Assert.Equal(Math.Round((1000 * Math.Sin(beta) * 1.01) + 10), model.SamplesMilliG[0]);
        Assert.Equal(Math.Round((1000 * Math.Cos(beta) * Math.Sin(rho)) - 20), model.SamplesMilliG[1]);
        Assert.Equal(Math.Round((1000 * Math.Cos(beta) * Math.Cos(rho) * 0.98) + 30), model.SamplesMilliG[2]);
    }

    [Fact]
    public void A_grade_tilts_the_reading_like_acceleration()
    {
        double grade = Math.Atan(0.08);
        var model = new AccelerometerModel(Quiet, grade, new Random(1));
        Run(model, seconds: 0.1, accel: 0);

        // Inclined plane: the specific force along the road is g·sin θ, normal to it g·cos θ.
        Assert.Equal(Math.Round(1000 * Math.Sin(grade)), model.SamplesMilliG[0]);
        Assert.Equal(Math.Round(1000 * Math.Cos(grade)), model.SamplesMilliG[2]);
    }

    [Fact]
    public void Body_pitch_tilts_the_reading()
    {
        double pitch = 0.02;
        var model = new AccelerometerModel(Quiet, 0, new Random(1));
        for (int i = 0; i < 1000; i++)
        {
            model.Advance(i * 1e-4, (i + 1) * 1e-4, 3.0, pitch, pitch);
        }

        // Rotation geometry: a body pitched nose up by φ while accelerating at a reads
        // x = a·cos φ + g·sin φ and z = −a·sin φ + g·cos φ (specific force in body axes).
        const double G0 = 9.80665;
        Assert.Equal(Math.Round(((3.0 * Math.Cos(pitch)) + (G0 * Math.Sin(pitch))) / G0 * 1000), model.SamplesMilliG[0]);
        Assert.Equal(Math.Round(((-3.0 * Math.Sin(pitch)) + (G0 * Math.Cos(pitch))) / G0 * 1000), model.SamplesMilliG[2]);
    }

    [Fact]
    public void Readings_clip_at_full_scale()
    {
        var model = new AccelerometerModel(Quiet with { FullScaleG = 2 }, 0, new Random(1));
        Run(model, seconds: 0.1, accel: 3 * 9.80665);
        Assert.All(Axis(model, 0), x => Assert.Equal(2000, x));
    }

    [Fact]
    public void Yaw_moves_forward_acceleration_onto_the_y_axis()
    {
        var model = new AccelerometerModel(Quiet with { MountYawDeg = 90 }, 0, new Random(1));
        Run(model, seconds: 0.1, accel: 0.5 * 9.80665);

        // A sensor turned 90° to the left has its y axis pointing backwards: it reads −a.
        Assert.Equal(0, model.SamplesMilliG[0]);
        Assert.Equal(-500, model.SamplesMilliG[1]);
    }

    private static void Run(AccelerometerModel model, double seconds, double accel)
    {
        int steps = (int)Math.Round(seconds / 1e-4);
        for (int i = 0; i < steps; i++)
        {
            model.Advance(i * 1e-4, (i + 1) * 1e-4, accel, 0, 0);
        }
    }

    private static double[] Axis(AccelerometerModel model, int axis) =>
        model.SamplesMilliG.Where((_, i) => i % 3 == axis).Select(v => (double)v).ToArray();
}
