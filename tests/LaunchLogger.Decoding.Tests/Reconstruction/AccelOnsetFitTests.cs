using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The accelerometer onset's stated σ against onsets placed by hand: a rest at a level,
/// then a rise (a linear ramp, a jump, or a jump onto a ramp), sampled at 1.6 kHz with white
/// noise, the onset put anywhere within a sample. Coverage of a Gaussian σ: 95.4 % within ±2σ
/// and 99.7 % within ±3σ (any statistics text); over 300 onsets per shape we ask 93 % and 98.5 %,
/// room for the sampling spread of the count itself.</summary>
public class AccelOnsetFitTests
{
    private const double RateHz = 1600;
    private const double NoiseMps2 = 0.06;

    [Theory]
    [InlineData(20.0, 0.0)]
    [InlineData(0.0, 3.0)]
    [InlineData(15.0, 0.8)]
    public void The_stated_sigma_covers_the_onset(double rampMps3, double jumpMps2)
    {
        var random = new Random(11);
        int within2 = 0;
        int within3 = 0;
        const int trials = 300;
        double period = 1 / RateHz;
        for (int trial = 0; trial < trials; trial++)
        {
            double onsetS = 1.0 + (random.NextDouble() * period);
            int n = (int)(1.5 * RateHz);
            var t = new double[n];
            var reading = new double[n];
            for (int i = 0; i < n; i++)
            {
                t[i] = i * period;
                double tau = t[i] - onsetS;
                double a = tau < 0 ? 0 : Math.Min(4, jumpMps2 + (rampMps3 * tau));
                double gauss = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
                reading[i] = 0.3 + a + (NoiseMps2 * gauss);
            }

            int to = (int)((onsetS + 0.15) * RateHz);
            AccelOnset? found = AccelOnsetFit.Find(t, reading, 0.3, NoiseMps2, 1, period, 0, to, lastRise: true);
            Assert.NotNull(found);
            double z = Math.Abs(found.Value.TimeS - onsetS) / found.Value.SigmaS;
            within2 += z <= 2 ? 1 : 0;
            within3 += z <= 3 ? 1 : 0;
        }

        Assert.True(within2 >= 0.93 * trials, $"±2σ: {within2} of {trials}");
        Assert.True(within3 >= 0.985 * trials, $"±3σ: {within3} of {trials}");
    }
}
