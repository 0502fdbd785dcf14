using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Where an accelerometer-only record places the car's stop, against the generator's
/// standstill: standing starts braked to rest, their samples written as a text file alone,
/// 100–1600 Hz with the generator's noise, bias, pitch and clock drift.</summary>
public class AccelOnlyStopTests
{
    public static TheoryData<int> Seeds => new() { 1, 2, 3, 4, 5, 10, 15, 19 };

    [Theory]
    [MemberData(nameof(Seeds))]
    public void The_stop_lies_within_half_a_sample_and_the_noise_of_the_standstill(int seed)
    {
        PrescribedRecordSpec spec = Records.Standing(seed);
        PrescribedRecord r = spec.Generate();
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeAccelerometerOnly(r).Runs);
        AccelSensor accel = spec.Accel!;

        // The file stamps sample i at t₀ + i/rate though it was taken at t₀ + i·(1 − drift)/rate
        // (the generator's clock), so the standstill falls on the file's clock at
        // t₀ + (T − t₀)/(1 − drift). The deceleration holds until the car rests, then stops:
        // the last sample still stopping and the first at rest bracket the truth, and the stop is
        // placed mid-way, within half a period. The window's speed sum adds its noise,
        // σ·√(2h + 1) over the deceleration a in samples (h = 0.05 s of samples; independent
        // errors add in quadrature, GUM), a taken as the stop's mean deceleration, no more than
        // the steady one the search divides by: 3 of those on top.
        double period = 1 / accel.RateHz;
        double onFileClock = accel.FirstSampleS + ((truth.StandstillS - accel.FirstSampleS) / (1 - (accel.ClockDriftPpm * 1e-6)));
        int half = (int)Math.Round(0.05 * accel.RateHz);
        double noise = accel.NoisePerSampleMps2 * Math.Sqrt((2 * half) + 1) / truth.MeanDecelMps2 * period;
        double stop = Assert.IsType<double>(a.Reconstruction.StopS);
        Assert.True(Math.Abs(stop - onFileClock) <= (0.5 * period) + (3 * noise), $"{spec}: stop {(stop - onFileClock) * 1e3:+0.00;-0.00} ms from the truth, period {period * 1e3:F2} ms, noise {noise * 1e3:F3} ms");
    }
}
