using LaunchLogger.Prescribed.Motion;
using MathNet.Numerics.Interpolation;

namespace LaunchLogger.Prescribed.Tests.Motion;

/// <summary>The generator's shape-preserving cubic against MathNet.Numerics' PCHIP, the
/// reference library it must match to the last bit (the tabulated pulls' edges are root-found
/// on it), and against the properties Fritsch &amp; Carlson's construction guarantees.</summary>
public class PchipCurveTests
{
    public static TheoryData<string, double[], double[]> Tables
    {
        get
        {
            // A pull falling off exponentially with two gear-change dips to a third, every 50 ms,
            // as the standing starts' shifted pulls are tabulated.
            double[] pullTimes = Enumerable.Range(0, 801).Select(i => i * 0.05).ToArray();
            double[] pull = pullTimes.Select(t => (1.5 + (6 * Math.Exp(-t / 7))) / ((t >= 3.1 && t < 3.35) || (t >= 6.3 && t < 6.55) ? 3 : 1)).ToArray();
            var random = new Random(7);
            double[] wiggleTimes = new double[40];
            for (int i = 1; i < wiggleTimes.Length; i++)
            {
                wiggleTimes[i] = wiggleTimes[i - 1] + 0.01 + random.NextDouble();
            }

            return new()
            {
                { "a shifted pull", pullTimes, pull },
                { "a curve with a peak", [0, 0.2, 0.6, 1.5, 3, 5], [0, 8, 9.5, 7, 4, 2.5] },
                { "flat stretches and sign changes", [0, 1, 2, 3, 4, 5, 6, 7], [0, 0, 3, 3, -2, 5, 5, 1] },
                { "steep ends", [0, 0.1, 0.11, 3, 3.01, 3.2], [10, -4, 6, 6.5, -9, 12] },
                { "random values, uneven times", wiggleTimes, wiggleTimes.Select(_ => (random.NextDouble() - 0.3) * 20).ToArray() },
            };
        }
    }

    [Theory]
    [MemberData(nameof(Tables))]
    public void It_gives_MathNets_PCHIP_to_the_last_bit(string name, double[] times, double[] values)
    {
        // MathNet.Numerics 5, CubicSpline.InterpolatePchipSorted: the reference implementation.
        IInterpolation reference = CubicSpline.InterpolatePchipSorted(times, values);
        var ours = new PchipCurve(times, values);
        var random = new Random(11);
        var points = new List<double>(times);
        for (int k = 0; k + 1 < times.Length; k++)
        {
            double w = times[k + 1] - times[k];
            points.AddRange([times[k] + (0.5 * w), times[k] + (w * random.NextDouble()), times[k] + (w * 1e-9), Math.BitDecrement(times[k + 1])]);
        }

        points.AddRange([times[0] - 0.3, times[^1] + 0.7, Math.BitDecrement(times[0]), Math.BitIncrement(times[^1])]);
        foreach (double t in points)
        {
            Assert.True(reference.Interpolate(t) == ours.At(t), $"{name}: at t = {t:R}, {reference.Interpolate(t):R} from MathNet, {ours.At(t):R} ours");
        }
    }

    [Fact]
    public void It_keeps_to_the_data_and_never_overshoots_monotone_data()
    {
        // Fritsch & Carlson (1980): the interpolant passes through every point and is monotone
        // on every interval where the data are.
        double[] times = [0, 0.3, 0.5, 2, 2.1, 4];
        double[] values = [0, 1, 1, 5, 9, 9.5];
        var curve = new PchipCurve(times, values);
        for (int k = 0; k < times.Length; k++)
        {
            Assert.Equal(values[k], curve.At(times[k]), 14);
        }

        for (int k = 0; k + 1 < times.Length; k++)
        {
            double previous = curve.At(times[k]);
            for (int j = 1; j <= 100; j++)
            {
                double value = curve.At(times[k] + ((times[k + 1] - times[k]) * j / 100));
                Assert.True(value >= previous - 1e-12 && value <= values[k + 1] + 1e-12, $"piece {k}, step {j}");
                previous = value;
            }
        }
    }

    [Fact]
    public void It_needs_three_points_and_as_many_values()
    {
        Assert.Throws<ArgumentException>(() => new PchipCurve([0, 1], [0, 1]));
        Assert.Throws<ArgumentException>(() => new PchipCurve([0, 1, 2], [0, 1]));
    }
}
