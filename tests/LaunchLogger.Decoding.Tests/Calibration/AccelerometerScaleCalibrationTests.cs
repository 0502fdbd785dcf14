using LaunchLogger.Decoding.Calibration;

namespace LaunchLogger.Decoding.Tests.Calibration;

public class AccelerometerScaleCalibrationTests
{
    private const double G0 = 9.80665;

    /// <summary>An axis that reads k times the force plus b gives +k·g + b pointing up and
    /// −k·g + b pointing down (specific force at rest is +g upward; any navigation text): the
    /// two rests give k and b back exactly when neither is tilted.</summary>
    [Theory]
    [InlineData(1.0, 0.0)]
    [InlineData(1.012, 0.05)]
    [InlineData(0.985, -0.12)]
    [InlineData(1.03, 0.3)]
    public void Plus_and_minus_one_g_give_the_scale_and_offset_back(double k, double b)
    {
        var gravity = new Estimate(G0, 0);
        AccelerometerScaleEstimate result = AccelerometerScaleCalibration.FromRests(new Estimate((k * G0) + b, 0), new Estimate((-k * G0) + b, 0), gravity, tiltDeg: 0);

        Assert.Equal(k, result.Scale.Value, 12);
        Assert.Equal(b, result.BiasMps2.Value, 12);
        Assert.Equal(0, result.Scale.Sigma, 12);
    }

    /// <summary>σ of k from the readings: (r↑ − r↓)/(2g) carries √(σ↑² + σ↓²)/(2g) (propagation
    /// of independent errors); σ of b is half the same.</summary>
    [Fact]
    public void The_readings_noise_propagates_into_scale_and_offset()
    {
        AccelerometerScaleEstimate result = AccelerometerScaleCalibration.FromRests(new Estimate(G0, 0.003), new Estimate(-G0, 0.004), new Estimate(G0, 0), tiltDeg: 0);

        Assert.Equal(0.005 / (2 * G0), result.Scale.Sigma, 12);
        Assert.Equal(0.0025, result.BiasMps2.Sigma, 12);
    }

    /// <summary>Rests tilted by up to the allowance read cos α of the force: the estimate takes
    /// the mean loss and its σ covers any tilt within the allowance (the extremes, 0 and α_max
    /// in both rests, lie within √6 σ = 2.45 σ of a uniform spread's mean).</summary>
    [Theory]
    [InlineData(0.0, 0.0)]
    [InlineData(3.0, 3.0)]
    [InlineData(1.0, 2.5)]
    [InlineData(3.0, 0.0)]
    public void A_tilt_within_the_allowance_lies_within_three_sigma(double upTiltDeg, double downTiltDeg)
    {
        const double k = 1.007;
        const double b = 0.04;
        double up = (k * G0 * Math.Cos(upTiltDeg * Math.PI / 180)) + b;
        double down = (-k * G0 * Math.Cos(downTiltDeg * Math.PI / 180)) + b;
        AccelerometerScaleEstimate result = AccelerometerScaleCalibration.FromRests(new Estimate(up, 1e-4), new Estimate(down, 1e-4), new Estimate(G0, 0), tiltDeg: 3);

        Assert.True(Math.Abs(result.Scale.Value - k) <= 3 * result.Scale.Sigma, $"{result.Scale} against {k}");
        Assert.True(Math.Abs(result.BiasMps2.Value - b) <= 3 * result.BiasMps2.Sigma, $"{result.BiasMps2} against {b}");

        // A 3° allowance costs at most (1 − cos 3°) = 0.14 % of scale: σ stays well under 0.2 %.
        Assert.True(result.Scale.Sigma < 0.001, $"{result.Scale.Sigma}");
    }

    /// <summary>Normal gravity of the WGS84 ellipsoid: 9.7803253359 m/s² at the equator and
    /// 9.8321849378 m/s² at the poles (NIMA TR8350.2, table 3.4, the defining and derived
    /// constants), 9.80620 m/s² at 45° (the same formula, handbook value from memory).</summary>
    [Theory]
    [InlineData(0.0, 9.7803253359, 1e-9)]
    [InlineData(90.0, 9.8321849378, 1e-9)]
    [InlineData(-90.0, 9.8321849378, 1e-9)]
    [InlineData(45.0, 9.80620, 1e-4)]
    public void Normal_gravity_matches_the_ellipsoids_published_values(double latitudeDeg, double expected, double tolerance)
    {
        Assert.Equal(expected, AccelerometerScaleCalibration.NormalGravityMps2(latitudeDeg), tolerance);
    }

    /// <summary>The free-air gradient, 0.3086 mGal per metre (common practice): 1000 m up is
    /// 3.086 mm/s² less.</summary>
    [Fact]
    public void Height_takes_the_free_air_gradient_off()
    {
        Assert.Equal(3.086e-3, AccelerometerScaleCalibration.NormalGravityMps2(52) - AccelerometerScaleCalibration.NormalGravityMps2(52, 1000), 9);
    }

    /// <summary>Without a latitude, standard gravity with σ of a uniform spread over normal
    /// gravity's equator-to-pole range, (9.832 − 9.780)/√12.</summary>
    [Fact]
    public void Without_a_place_gravity_is_standard_with_the_globes_spread()
    {
        Estimate g = AccelerometerScaleCalibration.LocalGravity(null);
        Assert.Equal(G0, g.Value);
        Assert.Equal(0.052 / Math.Sqrt(12), g.Sigma, 12);
    }

    [Fact]
    public void A_rest_level_from_seeded_noise_lies_within_three_sigma_of_the_true_level()
    {
        var random = new Random(42);
        const double level = 9.85;
        int n = 4000;
        var t = new double[n];
        var f = new double[n];
        for (int i = 0; i < n; i++)
        {
            t[i] = i * 0.005;
            f[i] = level + (0.02 * (random.NextDouble() - 0.5) * Math.Sqrt(12));
        }

        Estimate rest = AccelerometerScaleCalibration.RestLevel(t, f, "seeded");

        Assert.True(Math.Abs(rest.Value - level) <= 3 * rest.Sigma, $"{rest}");
        Assert.True(rest.Sigma < 0.002);
    }

    [Fact]
    public void A_box_that_moves_or_rests_too_briefly_is_refused()
    {
        var t = Enumerable.Range(0, 2000).Select(i => i * 0.005).ToArray();
        double[] moving = t.Select(x => 9.8 + (3 * Math.Sin(20 * x))).ToArray();
        Assert.Throws<CalibrationException>(() => AccelerometerScaleCalibration.RestLevel(t, moving, "moving"));
        Assert.Throws<CalibrationException>(() => AccelerometerScaleCalibration.RestLevel(t[..20], moving[..20], "short"));
    }

    [Fact]
    public void Readings_that_are_not_up_and_down_are_refused()
    {
        var g = new Estimate(G0, 0);
        Assert.Throws<CalibrationException>(() => AccelerometerScaleCalibration.FromRests(new Estimate(G0, 0), new Estimate(G0, 0), g));
        Assert.Throws<CalibrationException>(() => AccelerometerScaleCalibration.FromRests(new Estimate(-G0, 0), new Estimate(G0, 0), g));
    }
}
