using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Tests.Sensors;

/// <summary>The generator's pickup, capture and accelerometer against what they must be by
/// construction and by textbook geometry.</summary>
public class SensorTests
{
    private const double G = 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)

    private static MotionProfile Launch() => new MotionProfileBuilder().Hold(2).Constant(8, 4).Hold(2).Build();

    [Theory]
    [InlineData(8, 0.5)]
    [InlineData(48, 0.1)]
    [InlineData(100, 0.9)]
    public void Each_edge_of_a_rigid_tyre_sits_one_pitch_further_on(int teeth, double phase)
    {
        MotionProfile p = Launch();
        var pickup = new WheelPickup(teeth, TyreModel.Calibrated(1.9), phase);
        double[] edges = pickup.EdgeTimes(p);
        double pitch = 1.9 / teeth;
        double total = p.StateAt(p.EndS).DistanceM;
        Assert.Equal((int)Math.Floor((total / pitch) - phase) + 1, edges.Length);
        for (int k = 0; k < edges.Length; k += Math.Max(1, edges.Length / 50))
        {
            Assert.Equal((k + phase) * pitch, p.StateAt(edges[k]).DistanceM, 9);
        }
    }

    [Fact]
    public void A_growing_tyre_spaces_edges_by_its_circumference_at_speed()
    {
        // At a steady v the wheel turns v/C(v) revolutions per second, so pulses come every
        // C(v)/(N·v) (the definition of the circumference).
        double v = 40;
        var tyre = new TyreModel(2.0, 1.97, 0.006);
        MotionProfile p = new MotionProfileBuilder(v).Hold(3).Build();
        double[] edges = new WheelPickup(50, tyre).EdgeTimes(p);
        double c = 1.97 * (1 + (0.006 * (v / 30) * (v / 30)));
        for (int k = 1; k < edges.Length; k += 17)
        {
            Assert.Equal(c / (50 * v), edges[k] - edges[k - 1], 10);
        }
    }

    [Fact]
    public void A_growing_tyre_without_growth_gives_the_rigid_edges()
    {
        MotionProfile p = Launch();
        double[] rigid = new WheelPickup(24, TyreModel.Calibrated(1.9)).EdgeTimes(p);
        double[] integrated = new WheelPickup(24, new TyreModel(1.9, 1.9, 1e-15)).EdgeTimes(p);
        Assert.Equal(rigid.Length, integrated.Length);
        for (int k = 0; k < rigid.Length; k++)
        {
            Assert.Equal(rigid[k], integrated[k], 8);
        }
    }

    [Theory]
    [InlineData(1e-4, 0.0, 0.0)]
    [InlineData(1e-3, 0.2, 0.0)]
    [InlineData(10e-3, 0.3, 5.0)]
    public void Every_polled_bracket_holds_the_edge_that_made_its_count(double periodS, double jitter, double stallsPerSecond)
    {
        double[] edges = new WheelPickup(36, TyreModel.Calibrated(1.9)).EdgeTimes(Launch());
        var counter = new PolledCounter(periodS, jitter, stallsPerSecond, 0.02);
        IReadOnlyList<CountBracket> rows = counter.Read(edges, 12, new Random(4), origin: 1000);
        Assert.Equal(rows[0].Count, rows[1].Count);
        Assert.Equal(1000 + edges.Length, rows[^1].Count);
        for (int i = 2; i < rows.Count; i++)
        {
            long k = rows[i].Count - 1000;
            Assert.True(edges[k - 1] > rows[i].LoS && edges[k - 1] <= rows[i].HiS, $"row {i}");
            Assert.True(k == rows[i - 1].Count - 1000 + 1 || edges[k - 2] > rows[i].LoS, $"row {i}: every edge counted in it lies in it");
        }
    }

    [Fact]
    public void Edge_timing_is_late_never_early_and_strictly_increasing()
    {
        double[] edges = new WheelPickup(100, TyreModel.Calibrated(1.9)).EdgeTimes(Launch());
        double[] seen = new EdgeTiming(20e-6, 15e-6).Observe(edges, new Random(2));
        for (int i = 0; i < edges.Length; i++)
        {
            Assert.True(seen[i] >= edges[i] - 1e-12);
            Assert.True(i == 0 || seen[i] > seen[i - 1]);
            Assert.Equal(Math.Round(seen[i] * 1e6), seen[i] * 1e6, 6);
        }
    }

    [Theory]
    [InlineData(3.0, 0.0)]
    [InlineData(-2.0, 0.05)]
    public void At_rest_a_tilted_sensor_reads_gravity_resolved_on_its_axes(double pitchDeg, double gradeRad)
    {
        // Statics: on a grade γ a sensor pitched θ reads x = g·sin(θ + γ), z = g·cos(θ + γ).
        double theta = pitchDeg * Math.PI / 180;
        var sensor = new AccelSensor { RateHz = 100, PitchRad = theta, GradeRad = gradeRad };
        AccelSample[] s = sensor.Sample(new MotionProfileBuilder().Hold(1).Build(), new Random(1));
        Assert.Equal(101, s.Length);
        Assert.Equal(G * Math.Sin(theta + gradeRad), s[50].XMps2, 12);
        Assert.Equal(G * Math.Cos(theta + gradeRad), s[50].ZMps2, 12);
    }

    [Fact]
    public void A_drifting_sensor_clock_stamps_samples_at_the_nominal_rate()
    {
        var sensor = new AccelSensor { RateHz = 1600, ClockDriftPpm = 200, NoiseMicroGPerRootHz = 200, BiasXMps2 = 0.1 };
        AccelSample[] s = sensor.Sample(Launch(), new Random(3));
        Assert.Equal(1000 / 1600.0, s[1000].StampS, 12);
        Assert.Equal(1000 / 1600.0 * (1 - 200e-6), s[1000].TrueS, 12);

        // Noise: 200 µg/√Hz over 800 Hz (common practice for MEMS data sheets, from memory);
        // at rest the samples' spread is that, around the bias.
        double[] rest = s.Take(3000).Select(x => x.XMps2).ToArray();
        double mean = rest.Average();
        double sd = Math.Sqrt(rest.Select(x => (x - mean) * (x - mean)).Sum() / (rest.Length - 1));
        Assert.Equal(0.1, mean, 2);
        Assert.Equal(200e-6 * G * Math.Sqrt(800), sd, 2);
    }
}
