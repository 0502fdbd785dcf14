using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>The rests of an accelerometer-only record (plain text, no pulses) are found on 0.25-s
/// window means against the level of the rest the record ends in, so sample noise and engine
/// vibration do not hide them: the host's counterpart of the box's still test on block means.
/// (When the level came from the windows of least spread, a noisy sensor, as noisy under steady
/// acceleration as at rest, gave a level from a drive in 5 of these 20 records, and no cut.)</summary>
public class AccelRestFinderTests
{
    private const double G0 = 9.80665;

    [Theory]
    [InlineData(1, 0)]
    [InlineData(1, 40)]
    [InlineData(2, 0)]
    [InlineData(2, 40)]
    [InlineData(3, 0)]
    [InlineData(3, 40)]
    [InlineData(4, 0)]
    [InlineData(4, 40)]
    [InlineData(5, 0)]
    [InlineData(5, 40)]
    [InlineData(6, 0)]
    [InlineData(6, 40)]
    [InlineData(7, 0)]
    [InlineData(7, 40)]
    [InlineData(8, 0)]
    [InlineData(8, 40)]
    [InlineData(9, 0)]
    [InlineData(9, 40)]
    [InlineData(10, 0)]
    [InlineData(10, 40)]
    public void A_noisy_idling_record_is_cut_in_the_middle_of_its_rest_between_two_drives(int seed, double vibrationMilliG)
    {
        // Rest to 3 s, 3 m/s² for 5 s, -5 m/s² for 3 s (at rest at 11 s), rest to 15 s,
        // 2.5 m/s² for 4 s, -4 m/s² for 2.5 s (at rest at 21.5 s), rest to 26 s; 1.6 kHz samples
        // with 294 µg/√Hz of noise over the 800 Hz Nyquist band (σ ≈ 8.3 mg, white noise of
        // density ρ sampled at f: σ = ρ·√(f/2), common practice) and a 30 Hz engine vibration
        // throughout. Without the noise the cut is the rest's middle, 13 s.
        static double Truth(double t) => t < 3 ? 0 : t < 8 ? 3 : t < 11 ? -5 : t < 15 ? 0 : t < 19 ? 2.5 : t < 21.5 ? -4 : 0;
        double sigma = 0.294e-3 * Math.Sqrt(800) * G0;
        var random = new Random(seed);
        const double rate = 1600;
        int n = (int)(26 * rate);
        var time = new double[n];
        var forward = new double[n];
        for (int i = 0; i < n; i++)
        {
            double t = i / rate;
            double gaussian = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
            time[i] = t;
            forward[i] = Truth(t) + (sigma * gaussian) + (vibrationMilliG * 1e-3 * G0 * Math.Sin(2 * Math.PI * 30 * t));
        }

        var accel = new AccelSeries { TimeS = time, ForwardMps2 = forward, SamplePeriodS = 1 / rate };

        double cut = Assert.Single(AccelRestFinder.Cuts(accel));
        Assert.InRange(cut, 12.5, 13.5);
    }
}
