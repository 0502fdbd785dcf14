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
    [InlineData(8, 0.5, 2.0)]
    [InlineData(48, 0.1, 4.0)]
    [InlineData(100, 0.9, 9.0)]
    public void An_undriven_wheel_spun_up_by_its_tyre_counts_the_road_less_its_slip(int teeth, double phase, double accelMps2)
    {
        // Closed form. A wheel of inertia I turned only by its tyre needs F = I·α/r = I·a/r² at
        // the contact; a tyre gives F = C·N·s (the linear part of its force–slip curve; H. B.
        // Pacejka, "Tire and Vehicle Dynamics", ch. 1), so s = I·a/(r²·N·C), constant under a
        // constant a. From rest the wheel turns (1 − s)·a·t²/2, so edge k comes where the road
        // distance is (k + φ)·pitch / (1 − s). Once the speed holds (a = 0) the wheel keeps the lag
        // it built and turns with the road again. Wheel figures: I 1.1 kg·m², r 0.31 m, N 3.9 kN,
        // C 21 (plausible for a road car; from memory): s = 0.03–0.13 %, 2.5–51 mm over the
        // launch, far above the 10⁻⁸ m the edges are checked to.
        const double inertia = 1.1, radius = 0.31, load = 3900, stiffness = 21;
        double slip = inertia * accelMps2 / (radius * radius * load * stiffness);
        double circumference = 2 * Math.PI * radius;
        MotionProfile p = new MotionProfileBuilder().Hold(1).Constant(3, accelMps2).Hold(2).Build();
        var pickup = new WheelPickup(teeth, TyreModel.Calibrated(circumference), phase, SpinUp: new SpinUpLag(inertia, radius, load, stiffness));
        double[] edges = pickup.EdgeTimes(p);
        double pitch = circumference / teeth;
        double launchEnd = 0.5 * accelMps2 * 9;
        double wheelAtLaunchEnd = (1 - slip) * launchEnd;
        double wheelTotal = wheelAtLaunchEnd + (accelMps2 * 3 * 2);
        Assert.Equal((int)Math.Floor((wheelTotal / pitch) - phase) + 1, edges.Length);
        for (int k = 0; k < edges.Length; k++)
        {
            double wheel = (k + phase) * pitch;
            double road = wheel <= wheelAtLaunchEnd ? wheel / (1 - slip) : launchEnd + (wheel - wheelAtLaunchEnd);
            Assert.Equal(road, p.StateAt(edges[k]).DistanceM, 8);
        }
    }

    [Fact]
    public void A_spun_up_wheel_lags_only_while_the_car_speeds_up()
    {
        // At a steady speed and while braking the wheel turns with the road (a braked wheel's slip
        // is the brake's, BrakeSlip, not given here): cruise, then a stop, gives the rigid
        // wheel's edges.
        MotionProfile p = new MotionProfileBuilder(25).Hold(2).BrakeToStop(0.3, 7).Hold(1).Build();
        double[] rigid = new WheelPickup(36, TyreModel.Calibrated(1.9), 0.4).EdgeTimes(p);
        double[] lagging = new WheelPickup(36, TyreModel.Calibrated(1.9), 0.4, SpinUp: new SpinUpLag(1.4, 0.3, 2500, 15)).EdgeTimes(p);
        Assert.Equal(rigid.Length, lagging.Length);
        for (int k = 0; k < rigid.Length; k++)
        {
            Assert.Equal(rigid[k], lagging[k], 8);
        }
    }

    [Theory]
    [InlineData(25.0, 7.0, 20.0, 36, 0.4)]
    [InlineData(35.0, 9.5, 15.0, 100, 0.0)]
    [InlineData(15.0, 4.0, 30.0, 12, 0.7)]
    public void A_braked_wheel_misses_v0_squared_over_2_g_C_of_a_constant_deceleration_stop(double v0, double decel, double stiffness, int teeth, double phase)
    {
        // Closed form: cruise at v0, then a constant deceleration D to rest. While braking the
        // tread runs slower than the road by s = D / (g0·C) (Pacejka, "Tire and Vehicle Dynamics",
        // ch. 1, linear range; g0 = 9.80665 m/s², ISO 80000-3), so the wheel's distance at road
        // distance x past the onset is (1 − s)·x; the stop's v0²/(2D) then shows as
        // v0²/(2D) − v0²/(2·g0·C).
        double g0 = 9.80665;
        double s = decel / (g0 * stiffness);
        double cruise = v0 * 2;
        double stop = v0 * v0 / (2 * decel);
        MotionProfile p = new MotionProfileBuilder(v0).Hold(2).Constant(v0 / decel, -decel).Hold(1).Build();
        var pickup = new WheelPickup(teeth, TyreModel.Calibrated(1.9), phase, Brake: new BrakeSlip(stiffness));
        double[] edges = pickup.EdgeTimes(p);
        double pitch = 1.9 / teeth;
        double wheelTotal = cruise + stop - (v0 * v0 / (2 * g0 * stiffness));
        Assert.Equal((int)Math.Floor((wheelTotal / pitch) - phase) + 1, edges.Length);
        for (int k = 0; k < edges.Length; k++)
        {
            double wheel = (k + phase) * pitch;
            double road = wheel <= cruise ? wheel : cruise + ((wheel - cruise) / (1 - s));
            Assert.Equal(road, p.StateAt(edges[k]).DistanceM, 1e-6);
        }
    }

    [Theory]
    [InlineData(0.68, 0.49, 0.163, 0.5)]
    [InlineData(0.75, 0.62, 0.21, 0.9)]
    [InlineData(0.6, 0.45, 0.25, 0.3)]
    public void The_two_axles_of_a_braked_car_together_pass_the_car_s_deceleration(double bias, double frontWeight, double heightOverWheelbase, double g)
    {
        // Newton: the tyres' forces add up to m·D. Each axle passes (its force over its load) ×
        // (its load), so the loads' shares weighted by each axle's multiple of D/g0 sum to one,
        // whatever the split; and the load the front gains, m·D·h/L (the braking force's moment
        // at the centre of mass's height), the rear loses.
        BrakedAxle front = BrakedAxle.Front(bias, frontWeight, heightOverWheelbase);
        BrakedAxle rear = BrakedAxle.Rear(bias, frontWeight, heightOverWheelbase);
        double decel = g * 9.80665;
        double frontLoad = frontWeight + (heightOverWheelbase * g);
        Assert.Equal(1, (frontLoad * front.WorkAt(decel)) + ((1 - frontLoad) * rear.WorkAt(decel)), 12);

        // Its slip is that multiple of the car-deceleration slip D/(g0·C) (Pacejka's linear range).
        var slip = new BrakeSlip(20, rear);
        Assert.Equal(rear.WorkAt(decel) * decel / (9.80665 * 20), slip.At(-decel), 12);
        Assert.Equal(0, slip.At(1.0));

        // A front bias above the load the front carries then works the front tyres harder than
        // the car's deceleration and the rear ones less.
        if (bias > frontLoad)
        {
            Assert.True(front.WorkAt(decel) > 1 && rear.WorkAt(decel) < 1);
        }
    }

    [Fact]
    public void Drawn_brake_slips_stay_in_their_stated_range()
    {
        // C 15–30: at 1 g the slip lies between 1/30 and 1/15.
        var random = new Random(5);
        for (int i = 0; i < 200; i++)
        {
            BrakeSlip wheel = BrakeSlip.Draw(random);
            Assert.InRange(wheel.SlipStiffness, 15, 30);
            Assert.InRange(wheel.At(-9.80665), 1 / 30.0, 1 / 15.0);
            Assert.Equal(0, wheel.At(2.0));
        }
    }

    [Fact]
    public void Drawn_wheels_stay_in_their_stated_ranges()
    {
        // I 0.7–1.4 kg·m², N 2.5–5.5 kN, C 15–30, r from the tyre: the slip per m/s² then lies
        // between the corners I/(r²·N·C) of those ranges (r 0.3 m here).
        var random = new Random(9);
        double least = 0.7 / (0.09 * 5500 * 30);
        double most = 1.4 / (0.09 * 2500 * 15);
        for (int i = 0; i < 200; i++)
        {
            SpinUpLag wheel = SpinUpLag.Draw(random, 2 * Math.PI * 0.3);
            Assert.Equal(0.3, wheel.RadiusM, 12);
            Assert.InRange(wheel.PerMps2, least, most);
        }
    }

    [Fact]
    public void A_driven_wheel_cannot_also_lag_as_an_undriven_one()
    {
        var pickup = new WheelPickup(24, TyreModel.Calibrated(1.9), Slip: new DriveSlip(), SpinUp: new SpinUpLag(1, 0.3, 3700, 25));
        Assert.Throws<ArgumentException>(() => pickup.EdgeTimes(Launch()));
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
